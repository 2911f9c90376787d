import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';

/**
 * A small scanner of the import graph of the app's own modules: every `import … from`,
 * `export … from`, side-effect `import '…'` and dynamic `import('…')` of a module under
 * src/lib, type-only imports included (they are dependencies of the design even when erased).
 * Package imports and SvelteKit's virtual modules ($app, $env) are not followed.
 */

const ROOT = resolve('src/lib');
const SOURCE = /\.(ts|js|svelte)$/;

function sourceFiles(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return sourceFiles(path);
		return SOURCE.test(name) && !name.endsWith('.d.ts') ? [path] : [];
	});
}

/** The module specifiers a source text imports (comments removed first). */
export function importSpecifiers(text: string): string[] {
	const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');
	const found: string[] = [];
	const statement =
		/(?:^|[\s;}])(?:import|export)\s+(?:type\s+)?(?:[^'"`;]*?\s+from\s+)?['"]([^'"\n]+)['"]/g;
	for (const m of code.matchAll(statement)) found.push(m[1]!);
	for (const m of code.matchAll(/\bimport\s*\(\s*['"]([^'"\n]+)['"]\s*\)/g)) found.push(m[1]!);
	return found;
}

function resolveModule(from: string, specifier: string): string | null | 'external' {
	let base: string;
	if (specifier.startsWith('$lib/') || specifier === '$lib') {
		base = join(ROOT, specifier.slice('$lib'.length));
	} else if (specifier.startsWith('./') || specifier.startsWith('../')) {
		base = resolve(dirname(from), specifier);
	} else {
		return 'external';
	}
	const candidates = [
		base,
		`${base}.ts`,
		`${base}.js`,
		`${base}.svelte`,
		base.replace(/\.js$/, '.ts'),
		join(base, 'index.ts'),
		join(base, 'index.js')
	];
	const file = candidates.find((c) => existsSync(c) && statSync(c).isFile());
	if (!file) return null;
	return file.startsWith(ROOT + '/') ? file : 'external';
}

export interface ImportGraph {
	/** Edges between files under src/lib, as paths relative to src/lib. */
	edges: Map<string, Set<string>>;
	/** Imports that point into src/lib (relative or $lib) but name no file there. */
	unresolved: string[];
}

export function scanImports(): ImportGraph {
	const edges = new Map<string, Set<string>>();
	const unresolved: string[] = [];
	for (const file of sourceFiles(ROOT)) {
		const from = relative(ROOT, file);
		const targets = new Set<string>();
		for (const specifier of importSpecifiers(readFileSync(file, 'utf8'))) {
			const target = resolveModule(file, specifier);
			if (target === 'external') continue;
			if (target === null) unresolved.push(`${from}: ${specifier}`);
			else targets.add(relative(ROOT, target));
		}
		edges.set(from, targets);
	}
	return { edges, unresolved };
}

/**
 * The same graph between the parts of src/lib/server: each folder (server/catalogue,
 * server/search, …) is one node, and so is each file directly in src/lib/server.
 */
export function serverFolderGraph(graph: ImportGraph): Map<string, Set<string>> {
	const partOf = (file: string) => {
		const m = /^server\/([^/]+)(\/)?/.exec(file);
		return m ? `server/${m[1]}` : null;
	};
	const folders = new Map<string, Set<string>>();
	for (const [from, targets] of graph.edges) {
		const a = partOf(from);
		if (!a) continue;
		const out = folders.get(a) ?? new Set<string>();
		folders.set(a, out);
		for (const to of targets) {
			const b = partOf(to);
			if (b && b !== a) out.add(b);
		}
	}
	return folders;
}

/** Strongly connected components of more than one node (Tarjan): every import cycle. */
export function cycles(graph: Map<string, Set<string>>): string[][] {
	let counter = 0;
	const index = new Map<string, number>();
	const low = new Map<string, number>();
	const stack: string[] = [];
	const onStack = new Set<string>();
	const found: string[][] = [];
	const visit = (v: string) => {
		index.set(v, counter);
		low.set(v, counter);
		counter++;
		stack.push(v);
		onStack.add(v);
		for (const w of graph.get(v) ?? []) {
			if (!index.has(w)) {
				visit(w);
				low.set(v, Math.min(low.get(v)!, low.get(w)!));
			} else if (onStack.has(w)) {
				low.set(v, Math.min(low.get(v)!, index.get(w)!));
			}
		}
		if (low.get(v) === index.get(v)) {
			const component: string[] = [];
			let w: string;
			do {
				w = stack.pop()!;
				onStack.delete(w);
				component.push(w);
			} while (w !== v);
			if (component.length > 1) found.push(component.sort());
		}
	};
	for (const v of [...graph.keys()].sort()) if (!index.has(v)) visit(v);
	return found;
}

/** One path that closes a cycle within a component, for the failure message: a → b → … → a. */
export function cyclePath(graph: Map<string, Set<string>>, component: string[]): string {
	const inside = new Set(component);
	const start = component[0]!;
	const previous = new Map<string, string>();
	const queue = [start];
	while (queue.length > 0) {
		const v = queue.shift()!;
		for (const w of graph.get(v) ?? []) {
			if (!inside.has(w)) continue;
			if (w === start) {
				const path = [start];
				for (let u = v; u !== start; u = previous.get(u)!) path.splice(1, 0, u);
				return [...path, start].join(' → ');
			}
			if (!previous.has(w)) {
				previous.set(w, v);
				queue.push(w);
			}
		}
	}
	return component.join(', ');
}
