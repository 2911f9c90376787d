import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { startServer } from './server';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
	}
}

/**
 * Starts the production build (adapter-node) on a fresh temporary SQLite file with the demo
 * scenario, for the HTTP and browser tests. `npm test` builds before it runs.
 */
export default async function setup(project: TestProject) {
	if (!existsSync('build/index.js'))
		throw new Error('No production build: run `npm run build` first.');
	mkdirSync('test-results', { recursive: true }); // screenshots of the browser tests land here
	const dir = mkdtempSync(join(tmpdir(), 'hopline-e2e-'));
	// Every test file reaches this server from 127.0.0.1 without an account, so the per-address
	// calculator limit (30 a minute) would be shared by all of them and could refuse a browser
	// test's calculation; the limit itself is tested on a server of its own (calcLimits.test.ts).
	const server = await startServer(join(dir, 'e2e.sqlite'), { CALC_ANON_PER_MINUTE: '100000' });
	const baseUrl = server.baseUrl;
	project.provide('baseUrl', baseUrl);

	return async () => {
		await server.stop();
		rmSync(dir, { recursive: true, force: true });
	};
}
