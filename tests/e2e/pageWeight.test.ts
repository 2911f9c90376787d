import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { EXEMPT, PAGES, preloadedModules } from '../../bench/pageJs';
import { signInCookie } from '../support/session';

/*
 * First-load JavaScript (issue 14): no page held to the 45 kB goal (bench/pageJs.ts; not the
 * upload page nor the calculators) may preload the validation library or the plotting library.
 * The sizes themselves are a benchmark (`npm run bench:js`), never asserted; this checks only
 * which libraries a page starts with, from the `Link` header the production build sends.
 *
 * A library is recognised by text its minified code keeps whatever the chunk is called or
 * whichever modules share it: string literals that the library's own source holds in code every
 * use of it pulls in. Two checks keep the recognition honest: each text is in the installed
 * library, and the client build contains it somewhere (a calculator, the CSV worker…). Were a
 * text to vanish in a new version, those checks fail instead of this one passing unseen.
 */
const base = inject('baseUrl');

const LIBRARIES = [
	{
		name: 'zod',
		// The constructor name of the base class of every Zod schema.
		text: '$ZodType',
		source: 'node_modules/zod/v4/core/schemas.js'
	},
	{
		name: 'd3-scale',
		// A named colour of d3-color, which the continuous scales interpolate through.
		text: 'aliceblue',
		source: 'node_modules/d3-color/dist/d3-color.mjs'
	},
	{
		name: 'd3-shape',
		// An error of d3-path, which draws every line and area of d3-shape.
		text: 'negative radius',
		source: 'node_modules/d3-path/dist/d3-path.mjs'
	}
] as const;
type Library = (typeof LIBRARIES)[number]['name'];

const budgetPages = PAGES.filter(([path]) => !(path in EXEMPT));
const cookies = new Map<string, string>();
const moduleText = new Map<string, Promise<string>>();

/** A module's code as the server sends it, fetched once per test run. */
function fetchModule(url: string): Promise<string> {
	let text = moduleText.get(url);
	if (!text) {
		text = fetch(url).then((res) => {
			if (!res.ok) throw new Error(`${url} answered ${res.status}`);
			return res.text();
		});
		moduleText.set(url, text);
	}
	return text;
}

/** The libraries among the modules a page preloads. */
async function librariesPreloadedBy(path: string, role: string | null): Promise<Library[]> {
	const res = await fetch(base + path, {
		headers: role ? { cookie: cookies.get(role) as string } : {},
		redirect: 'manual'
	});
	await res.arrayBuffer();
	expect(res.status, path).toBe(200);
	const urls = preloadedModules(res.headers.get('link')).map((href) =>
		new URL(href, base + path).toString()
	);
	const code = await Promise.all(urls.map(fetchModule));
	return LIBRARIES.filter((lib) => code.some((c) => c.includes(lib.text))).map((lib) => lib.name);
}

/** Every JavaScript file of the client build (pages, chunks, workers). */
function clientModules(dir = 'build/client/_app/immutable'): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) return clientModules(path);
		return entry.name.endsWith('.js') ? [path] : [];
	});
}

beforeAll(async () => {
	for (const role of new Set(budgetPages.map(([, r]) => r)))
		if (role)
			cookies.set(role, await signInCookie(base, `${role}@demo.hopline.test`, `demo-${role}-pass`));
});

describe('how each library is recognised', () => {
	it.each(LIBRARIES)('$name: its text is in the installed library', ({ text, source }) => {
		expect(readFileSync(source, 'utf8')).toContain(text);
	});

	it('finds each library somewhere in the client build, minified', () => {
		const code = clientModules().map((file) => readFileSync(file, 'utf8'));
		expect(code.length).toBeGreaterThan(0);
		for (const lib of LIBRARIES)
			expect(
				code.some((c) => c.includes(lib.text)),
				`${lib.name} is in no client module: if no page uses it any more, take it off LIBRARIES`
			).toBe(true);
	});
});

describe('pages held to the first-load goal', () => {
	it('lists some pages, each signed in as its role', () => {
		expect(budgetPages.length).toBeGreaterThan(10);
		expect(budgetPages.map(([path]) => path)).toContain('/admin/users');
	});

	it.each(budgetPages)('%s preloads neither zod nor d3', async (path, role) => {
		const found = await librariesPreloadedBy(path, role);
		expect(found, `${path} preloads ${found.join(', ')}`).toEqual([]);
	});
});
