import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MUTATIONS } from '../support/mutations';

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		return statSync(path).isDirectory() ? files(path) : [path];
	});
}

/** Mutating exports found in the route files: action names and non-GET handlers. */
function mutatingExports(): string[] {
	const found: string[] = [];
	for (const path of files('src/routes')) {
		const file = relative('src/routes', path);
		const text = readFileSync(path, 'utf8');
		if (file.endsWith('+page.server.ts')) {
			const actions = /export const actions[^=]*=\s*(\{[\s\S]*?\n\};|\{[^}]*\})/.exec(text)?.[1];
			if (!actions) continue;
			// Top-level keys only: one tab deep in a multi-line object, or the keys of a one-liner.
			const names = actions.includes('\n')
				? [...actions.matchAll(/^\t(\w+):/gm)].map((m) => m[1]!)
				: [...actions.matchAll(/(\w+)\s*:/g)].map((m) => m[1]!);
			for (const name of names.length ? names : ['default']) found.push(`${file}#${name}`);
		}
		if (file.endsWith('+server.ts')) {
			for (const m of text.matchAll(/export const (POST|PUT|PATCH|DELETE|fallback)\b/g))
				found.push(`${file}#${m[1]}`);
		}
	}
	return found.sort();
}

describe('authorization table', () => {
	it('lists every mutating route, so a new one cannot be left unchecked', () => {
		const listed = [...new Set(MUTATIONS.map((m) => `${m.file}#${m.name}`))].sort();
		expect(listed).toEqual(mutatingExports());
	});
});
