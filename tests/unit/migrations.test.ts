import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';

describe('migration list', () => {
	it('lists every migration file, in order, under its file name', () => {
		const files = readdirSync('migrations')
			.filter((f) => /^\d{4}_[a-z0-9_]+\.ts$/.test(f))
			.map((f) => f.replace(/\.ts$/, ''))
			.sort();
		expect(Object.keys(migrations)).toEqual(files);
	});
});
