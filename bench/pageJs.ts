// First-load JavaScript per page: what a browser downloads before a page becomes interactive,
// gzipped, beside the goal of 45 kB (the upload page and the calculators are allowed more: they
// parse files and draw plots in the browser). Printed, never asserted.
//
// The production build answers every page with a `Link` header that lists each module the page
// needs at start (SvelteKit's modulepreload list: the router, the layouts, the page and every
// chunk they import); the figure is the sum of those files, each gzipped at level 9 as a server
// or CDN would send it. Pages served without hydration (`csr = false`: the entry pages) have no
// such list but a script of their own in a `<script src>` tag; the scripts a page's HTML names
// are counted too, each file once. Modules a page loads later on demand (dynamic imports) are
// not counted.
import { mkdtempSync, readFileSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { startServer } from '../tests/support/server';
import { signInCookie } from '../tests/support/session';

const GOAL_KB = 45;
/** Pages that are allowed more than the goal, and why. */
export const EXEMPT: Record<string, string> = {
	'/submissions/upload': 'parses CSV in the browser',
	'/calc/hop-rate': 'calculator',
	'/calc/titration': 'calculator',
	'/calc/tunnelling': 'calculator'
};

type Role = 'reader' | 'contributor' | 'curator' | 'admin';
/** The pages measured, each with the role it is opened as (tests/e2e/pageWeight.test.ts uses it too). */
export const PAGES: [path: string, role: Role | null][] = [
	['/', null],
	['/search', null],
	['/search?kind=fe4s4', null],
	['/proteins', null],
	['/e/HL000007', null],
	['/e/HL000056', null],
	['/e/HL000007/v1', null],
	['/e/HL000007/compare?from=1&to=1', null],
	['/calc', null],
	['/calc/hop-rate', null],
	['/calc/titration', null],
	['/calc/tunnelling', null],
	['/api', null],
	['/csv/columns', null],
	['/signin', null],
	['/signup', null],
	['/reset', null],
	['/account', 'reader'],
	['/submissions', 'contributor'],
	['/submissions/new/potential', 'contributor'],
	['/submissions/new/centre', 'contributor'],
	['/submissions/upload', 'contributor'],
	['/review', 'curator'],
	['/audit', 'curator'],
	['/admin/users', 'admin'],
	['/admin/groups', 'admin'],
	['/admin/mail', 'admin'],
	['/admin/backups', 'admin']
];

/** Same-origin script files the page's HTML loads by `<script src>` (not inline scripts). */
function scriptSources(html: string): string[] {
	return [...html.matchAll(/<script\b[^>]*\bsrc="([^"]+)"/g)]
		.map((m) => m[1] ?? '')
		.filter((src) => src.startsWith('/'));
}

/** The module files a page preloads, from its `Link` header. */
export function preloadedModules(link: string | null): string[] {
	if (!link) return [];
	return link
		.split(',')
		.filter((part) => /rel="modulepreload"/.test(part))
		.map((part) => /<([^>]+)>/.exec(part)?.[1] ?? '')
		.filter((href) => href !== '');
}

export async function benchPageJs(): Promise<void> {
	if (!existsSync('build/client/_app')) throw new Error('run `npm run build` first');
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-js-'));
	const server = await startServer(join(dir, 'bench.sqlite'));
	const gzipped = new Map<string, { raw: number; gzip: number }>();
	const sizeOf = (href: string) => {
		const file = join('build/client', new URL(href, 'http://x/').pathname);
		let size = gzipped.get(file);
		if (!size) {
			const bytes = readFileSync(file);
			size = { raw: bytes.length, gzip: gzipSync(bytes, { level: 9 }).length };
			gzipped.set(file, size);
		}
		return size;
	};
	try {
		const cookies = new Map<Role, string>();
		for (const role of ['reader', 'contributor', 'curator', 'admin'] as const)
			cookies.set(
				role,
				await signInCookie(server.baseUrl, `${role}@demo.hopline.test`, `demo-${role}-pass`)
			);
		console.log(`First-load JavaScript per page (gzip -9; goal ≤ ${GOAL_KB} kB)`);
		console.log('page | as | modules | raw kB | gzip kB | within goal');
		console.log('--- | --- | ---: | ---: | ---: | ---');
		let over = 0;
		for (const [path, role] of PAGES) {
			const res = await fetch(server.baseUrl + path, {
				headers: role ? { cookie: cookies.get(role) as string } : {},
				redirect: 'manual'
			});
			const html = await res.text();
			if (res.status !== 200) throw new Error(`${path} answered ${res.status}`);
			const files = [...preloadedModules(res.headers.get('link')), ...scriptSources(html)];
			const modules = [...new Set(files.map((href) => new URL(href, 'http://x/').pathname))];
			const sizes = modules.map(sizeOf);
			const raw = sizes.reduce((sum, s) => sum + s.raw, 0) / 1000;
			const gzip = sizes.reduce((sum, s) => sum + s.gzip, 0) / 1000;
			const verdict = gzip <= GOAL_KB ? 'yes' : EXEMPT[path] ? `exempt (${EXEMPT[path]})` : 'NO';
			if (verdict === 'NO') over += 1;
			console.log(
				`${path} | ${role ?? 'anyone'} | ${modules.length} | ${raw.toFixed(1)} | ${gzip.toFixed(1)} | ${verdict}`
			);
		}
		console.log(
			over === 0
				? 'Every page within the goal (exempt pages aside).'
				: `${over} page(s) over the goal.`
		);
	} finally {
		await server.stop();
		rmSync(dir, { recursive: true, force: true });
	}
}
