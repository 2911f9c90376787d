import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import { buildLargeCentre } from '../support/largeCentre';
import { startServer, type RunningServer } from '../support/server';

/**
 * One centre with 5 000 approved potentials, nearly all conflicting with each other. Every page
 * and API path of that centre, its protein and its potentials must answer with a bounded body
 * while the server's memory stays bounded. The bounds: every response under 1 MB (pages list 50
 * rows a list, conflict flags name 5 values per row), the server's resident memory under 400 MB
 * after all of them, and each answer within 20 s on a loaded CI machine (before, such a page
 * grew to 161 MB at 1 000 values and killed the process at 2 000).
 */
const COUNT = 5000;
const MAX_BODY_BYTES = 1_000_000;
const MAX_RSS_BYTES = 400 * 1024 * 1024;
let server: RunningServer;
let dir: string;
let fx: Awaited<ReturnType<typeof buildLargeCentre>>;

function rssBytes(pid: number): number {
	const status = readFileSync(`/proc/${pid}/status`, 'utf8');
	const kb = Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? NaN);
	return kb * 1024;
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-large-'));
	const path = join(dir, 'large.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	fx = await buildLargeCentre(db, COUNT);
	await db.destroy();
	server = await startServer(path);
}, 300_000);

afterAll(async () => {
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

describe(`a centre with ${COUNT} potentials`, () => {
	it('serves every page and API path of it with bounded bodies and memory', async () => {
		const paths = [
			`/e/${fx.centre}`,
			`/e/${fx.centre}/v1`,
			`/e/${fx.centre}?potentials=50`,
			`/e/${fx.centre}?potentials=100`,
			`/e/${fx.centre}/__data.json`,
			`/e/${fx.protein}`,
			`/e/${fx.protein}?potentials=3`,
			`/e/${fx.protein}/__data.json`,
			`/e/${fx.onePotential}`,
			`/e/${fx.onePotential}/__data.json`,
			`/api/v1/entries/${fx.centre}`,
			`/api/v1/entries/${fx.onePotential}`,
			`/api/v1/potentials?centre=${fx.centre}&limit=100`,
			`/api/v1/potentials?centre=${fx.centre}&limit=100&format=csv`,
			`/api/v1/potentials?protein=${fx.protein}&limit=100&sort=em`,
			`/api/v1/centres?protein=${fx.protein}`,
			`/search?q=${fx.centre}`,
			`/search?q=${fx.protein}&sort=em`
		];
		const timings: string[] = [];
		for (const path of paths) {
			const start = performance.now();
			const res = await fetch(`${server.baseUrl}${path}`, {
				signal: AbortSignal.timeout(20_000)
			});
			const body = await res.arrayBuffer();
			timings.push(`${path}: ${(performance.now() - start).toFixed(0)} ms, ${body.byteLength} B`);
			expect(res.status, path).toBe(200);
			expect(body.byteLength, path).toBeLessThan(MAX_BODY_BYTES);
		}
		const rss = rssBytes(server.process.pid as number);
		console.log(
			`${COUNT}-potential centre:\n  ${timings.join('\n  ')}\n  server RSS ${(rss / 1048576).toFixed(0)} MB`
		);
		expect(rss).toBeLessThan(MAX_RSS_BYTES);
	});

	it('counts all conflicts of a potential but names five, and pages the centre list', async () => {
		const page = await (await fetch(`${server.baseUrl}/e/${fx.onePotential}`)).text();
		expect(page).toMatch(/\d{3,} approved values/);
		expect(page).toContain('the 5 largest differences listed');
		const centre = await (await fetch(`${server.baseUrl}/e/${fx.centre}?potentials=2`)).text();
		expect(centre).toMatch(/51–100 of 50\d\d/);
		const tooFar = await fetch(`${server.baseUrl}/e/${fx.centre}?potentials=0`);
		expect(tooFar.status).toBe(400);
	});
});
