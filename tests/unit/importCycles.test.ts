import { describe, expect, it } from 'vitest';
import {
	cyclePath,
	cycles,
	importSpecifiers,
	scanImports,
	serverFolderGraph
} from '../support/importGraph';

// Circular imports between the parts of the server make every part depend on all the others
// (and, between files, leave ES modules half-initialised while they load). This scans the import
// statements under src/lib and fails when a cycle appears.

/**
 * Folder imports that close cycles which already exist, each to be removed by the part of the
 * work that owns it; they are left out of the check below. The list may only shrink: an entry
 * that no longer exists fails the test, so that it is taken off.
 */
const KNOWN_BACK_EDGES: [from: string, to: string][] = [
	// http/failures.ts and http/originCheck.ts answer with api/respond.ts's JSON error shape,
	// while api/handler.ts maps errors through http/failures.ts.
	['server/http', 'server/api'],
	// requestLimits.ts sets headers with http/headers.ts; http/index.ts re-exports the limits.
	['server/requestLimits.ts', 'server/http'],
	// The per-kind rules (server/kinds) use the catalogue's read-model helpers and the upload
	// rows, and the catalogue and uploads reach the rules through the kinds' registry.
	['server/catalogue', 'server/kinds'],
	['server/uploads', 'server/kinds']
];

describe('import graph scanner', () => {
	it('reads every form of import and ignores comments', () => {
		const text = [
			"import a from './a';",
			'import {',
			'\tb,',
			'\ttype B',
			"} from '$lib/b';",
			"import type { C } from '../c';",
			"export { d } from './d';",
			"export * from './e';",
			"import './f';",
			"const g = await import('./g');",
			"// import h from './h';",
			"/* import i from './i'; */",
			"const s = 'import j from nowhere';"
		].join('\n');
		expect(importSpecifiers(text)).toEqual(['./a', '$lib/b', '../c', './d', './e', './f', './g']);
	});

	it('finds cycles and names a path round each', () => {
		const graph = new Map([
			['a', new Set(['b'])],
			['b', new Set(['c'])],
			['c', new Set(['a', 'd'])],
			['d', new Set<string>()]
		]);
		expect(cycles(graph)).toEqual([['a', 'b', 'c']]);
		expect(cyclePath(graph, ['a', 'b', 'c'])).toBe('a → b → c → a');
		graph.get('c')!.delete('a');
		expect(cycles(graph)).toEqual([]);
	});
});

describe('imports under src/lib', () => {
	const graph = scanImports();

	it('all resolve to files (so that no edge is missed)', () => {
		expect(graph.unresolved).toEqual([]);
		expect(graph.edges.size).toBeGreaterThan(100);
	});

	it('hold no cycle between files', () => {
		expect(cycles(graph.edges).map((c) => cyclePath(graph.edges, c))).toEqual([]);
	});

	it('hold no cycle between the folders of src/lib/server but the known ones', () => {
		const folders = serverFolderGraph(graph);
		for (const [from, to] of KNOWN_BACK_EDGES) {
			expect(folders.get(from)?.has(to), `${from} → ${to} is gone: remove it from the list`).toBe(
				true
			);
			folders.get(from)!.delete(to);
		}
		expect(cycles(folders).map((c) => cyclePath(folders, c))).toEqual([]);
	});

	it('keep the search indexes below the catalogue: search imports only the database layer', () => {
		const folders = serverFolderGraph(graph);
		expect([...(folders.get('server/search') ?? [])]).toEqual(['server/db']);
		expect(folders.get('server/catalogue')?.has('server/search')).toBe(true);
	});
});
