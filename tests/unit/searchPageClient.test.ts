import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

/*
 * The search page's browser code lays out what the server prepared (the parsed query, rows and
 * facets as text): it never loads the schema library, the number formats or the vocabularies,
 * which weigh more than the page itself (bench/pageJs.ts measures the page; issue 14 §5). This
 * follows the value imports (type-only ones are erased) from the page's client modules through
 * the app's own files and fails when one of those modules is reached again.
 */
const ENTRIES = [
	'src/routes/search/+page.svelte',
	'src/routes/search/Facets.svelte',
	'src/routes/search/columns.ts'
];
/** Modules the page's browser code must not reach, and where their work is done instead. */
const SERVER_SIDE: [pattern: RegExp, instead: string][] = [
	[/^zod$/, 'the query is parsed in +page.server.ts'],
	[/^src\/lib\/schemas\//, 'schemas stay on the server; lists live in $lib/catalogue/searchTable'],
	[/^src\/lib\/format\.ts$/, 'rows are formatted in $lib/server/catalogue/searchRows'],
	[/^src\/lib\/science\//, 'labels come from $lib/server/catalogue/searchRows']
];

/** Specifiers of the value imports of a source text (`import type …` left out). */
function valueImports(text: string): string[] {
	const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');
	const found: string[] = [];
	for (const m of code.matchAll(
		/(?:^|[\s;}])(import|export)\s+(type\s+)?(?:([^'"`;]*?)\s+from\s+)?['"]([^'"\n]+)['"]/g
	)) {
		const typeOnly = m[2] !== undefined || /^\{\s*(?:type\s+[\w$]+\s*,?\s*)+\}$/.test(m[3] ?? '');
		if (!typeOnly) found.push(m[4]!);
	}
	for (const m of code.matchAll(/\bimport\s*\(\s*['"]([^'"\n]+)['"]\s*\)/g)) found.push(m[1]!);
	return found;
}

/** A file of the app for a specifier, or the specifier itself for a package or virtual module. */
function resolveImport(from: string, specifier: string): string {
	let base: string;
	if (specifier.startsWith('$lib/')) base = resolve('src/lib', specifier.slice('$lib/'.length));
	else if (specifier.startsWith('./') || specifier.startsWith('../'))
		base = resolve(dirname(from), specifier);
	else return specifier;
	const file = [base, `${base}.ts`, `${base}.js`, `${base}.svelte`, join(base, 'index.ts')].find(
		(c) => existsSync(c) && statSync(c).isFile()
	);
	return file ? relative(process.cwd(), file) : specifier;
}

function clientGraph(): Map<string, string> {
	const reachedFrom = new Map<string, string>(ENTRIES.map((e) => [e, '(entry)']));
	const queue = [...ENTRIES];
	while (queue.length > 0) {
		const file = queue.shift()!;
		for (const specifier of valueImports(readFileSync(file, 'utf8'))) {
			const target = resolveImport(file, specifier);
			if (reachedFrom.has(target)) continue;
			reachedFrom.set(target, file);
			if (target.startsWith('src/')) queue.push(target);
		}
	}
	return reachedFrom;
}

describe("the search page's browser code", () => {
	it('reads the type-only imports as erased', () => {
		const text = [
			"import type { A } from '$lib/a';",
			"import { type B, type C } from '$lib/b';",
			"import { type D, e } from '$lib/e';",
			"import F from './F.svelte';"
		].join('\n');
		expect(valueImports(text)).toEqual(['$lib/e', './F.svelte']);
	});

	it('reaches no schema, number format or vocabulary', () => {
		const reached = clientGraph();
		expect(reached.has('@tanstack/svelte-table'), 'the table is still built with tanstack').toBe(
			true
		);
		const offending = [...reached].flatMap(([module, from]) =>
			SERVER_SIDE.filter(([pattern]) => pattern.test(module)).map(
				([, instead]) => `${module} (imported by ${from}): ${instead}`
			)
		);
		expect(offending).toEqual([]);
	});
});
