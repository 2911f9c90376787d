import { expect, it } from 'vitest';

/*
 * src/hooks.client.ts turns off Zod's eval probe by writing to Zod's global configuration object
 * without importing Zod. Zod's own `config()` must return that very object, with the setting.
 */
it('Zod reads its configuration from globalThis.__zod_globalConfig', async () => {
	await import('../../src/hooks.client');
	const { z } = await import('zod');
	const holder = globalThis as { __zod_globalConfig?: { jitless?: boolean } };
	expect(z.config()).toBe(holder.__zod_globalConfig);
	expect(z.config().jitless).toBe(true);
});
