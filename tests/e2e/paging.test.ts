import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page, PotentialDto } from '$lib/catalogue/dto';
import type { ApiErrorBody } from '$lib/schemas/apiError';
import { encodeOffsetCursor } from '$lib/schemas/pagination';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { ensureDemoAccounts } from '$seed/accounts';
import { loadDemoScenario } from '$seed/load';
import { potentialAtPh7 } from '../support/largeCentre';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/**
 * Paging, CSV and HTTP caching of the read API as clients meet them over HTTP, on the
 * production build. Approvals come from this test process, as a curator's would from another.
 */
let server: RunningServer;
let dir: string;
let db: Kysely<Database>;
let base: string;
let fx: { centre: string; couple: string; potential: string };

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-paging-'));
	const path = join(dir, 'p.sqlite');
	db = openDatabase(path);
	await migrateToLatest(db);
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	const row = await db
		.selectFrom('potential')
		.select(['centre_accession', 'couple', 'accession'])
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	fx = { centre: row.centre_accession, couple: row.couple, potential: row.accession };
	server = await startServer(path);
	base = server.baseUrl;
}, 120_000);

afterAll(async () => {
	await server?.stop();
	await db?.destroy();
	rmSync(dir, { recursive: true, force: true });
});

const get = (path: string, headers: Record<string, string> = {}) =>
	fetch(path.startsWith('http') ? path : `${base}${path}`, { headers });

type ApiPage = Page<PotentialDto> & { links: { next: string | null; prev: string | null } };

async function approvePotential(reportedValue: number): Promise<string> {
	return db.transaction().execute(async (trx) => {
		const entry = await createEntry(trx, { kind: 'potential' });
		const data = potentialAtPh7(fx.centre, fx.couple, reportedValue);
		await approveVersion(trx, await addVersion(trx, entry.id, data, { status: 'submitted' }));
		return entry.accession;
	});
}

describe('paging the read API', () => {
	it('walks by absolute links and Link headers, missing nothing while an approval lands before the walk', async () => {
		const first = '/api/v1/potentials?sort=em&order=desc&limit=5';
		const whole = (await (await get(`${first.replace('limit=5', 'limit=500')}`)).json()) as ApiPage;
		const seen: string[] = [];
		let next: string | null = first;
		let pages = 0;
		while (next) {
			const res = await get(next);
			expect(res.status).toBe(200);
			const body = (await res.json()) as ApiPage;
			seen.push(...body.items.map((p) => p.accession));
			if (body.links.next) {
				expect(body.links.next.startsWith(`${base}/api/v1/potentials?`)).toBe(true);
				expect(res.headers.get('link')).toContain(`<${body.links.next}>; rel="next"`);
			}
			if (body.links.prev) expect(body.links.prev.startsWith(base)).toBe(true);
			if (++pages === 2) await approvePotential(1800); // sorts first: behind the walk
			next = body.links.next;
		}
		expect(seen).toEqual(whole.items.map((p) => p.accession));
	});

	it('still reads an old offset cursor, and refuses a cursor of another sort with 400 on cursor', async () => {
		const old = (await (
			await get(`/api/v1/potentials?sort=accession&limit=3&cursor=${encodeOffsetCursor(3)}`)
		).json()) as ApiPage;
		const whole = (await (
			await get('/api/v1/potentials?sort=accession&limit=6')
		).json()) as ApiPage;
		expect(old.items.map((p) => p.accession)).toEqual(whole.items.slice(3).map((p) => p.accession));
		expect(old.offset).toBe(3);
		const cursor = new URL(old.links.next!).searchParams.get('cursor');
		const refused = await get(`/api/v1/potentials?sort=em&limit=3&cursor=${cursor}`);
		expect(refused.status).toBe(400);
		const body = (await refused.json()) as ApiErrorBody;
		expect(body.error.code).toBe('bad_request');
		expect(body.error.fields?.cursor?.[0]).toMatch(/sort=accession/);
	});
});

describe('CSV', () => {
	it('answers an empty result with the header row, and writes booleans as TRUE/FALSE', async () => {
		const empty = await get('/api/v1/potentials?q=zzyzxq&format=csv');
		expect(empty.status).toBe(200);
		expect(empty.headers.get('x-total-count')).toBe('0');
		const text = await empty.text();
		expect(text.split('\r\n')).toHaveLength(1);
		expect(text).toMatch(/^accession,version,.*,demo_data$/);
		const distances = await (await get('/api/v1/distances?format=csv&limit=2')).text();
		const parsed = Papa.parse<Record<string, string>>(distances, { header: true });
		expect(parsed.meta.fields).toContain('edge_to_edge_angstrom');
		expect(parsed.meta.fields).toContain('centre_to_centre_angstrom');
		expect(parsed.meta.fields).not.toContain('edge_to_edge_a');
		expect(parsed.data[0]?.demo_data).toBe('TRUE');
		const noDistances = await (await get('/api/v1/distances?edgeMin=99&format=csv')).text();
		expect(noDistances).toMatch(/^accession,.*edge_to_edge_angstrom/);
	});

	it('exports every matching row, counted up front, in the order of the search', async () => {
		const list = (await (
			await get('/api/v1/potentials?kind=fe4s4&sort=em&order=desc&limit=500')
		).json()) as ApiPage;
		const res = await get('/api/v1/potentials/export?kind=fe4s4&sort=em&order=desc');
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
		expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="potentials.csv"/);
		const total = Number(res.headers.get('x-total-count'));
		expect(total).toBe(list.total);
		const rows = Papa.parse<Record<string, string>>((await res.text()).trimEnd(), { header: true });
		expect(rows.data).toHaveLength(total);
		expect(rows.data.map((r) => r.accession)).toEqual(list.items.map((p) => p.accession));
		const bad = await get('/api/v1/potentials/export?limit=5');
		expect(bad.status).toBe(400);
	});
});

describe('HTTP caching', () => {
	it('tags lists and facets by revision and query; 304 until an approval', async () => {
		for (const path of ['/api/v1/potentials?kind=fe4s4&limit=3', '/api/v1/facets']) {
			const first = await get(path);
			const etag = first.headers.get('etag')!;
			expect(etag).toMatch(/^"l-/);
			expect(first.headers.get('cache-control')).toBe('public, no-cache');
			const again = await get(path, { 'if-none-match': etag });
			expect(again.status).toBe(304);
			await approvePotential(-77);
			const moved = await get(path, { 'if-none-match': etag });
			expect(moved.status).toBe(200);
			expect(moved.headers.get('etag')).not.toBe(etag);
		}
	});

	it('serves API versions immutable to everyone, privately to the signed-in; pages and the latest are revalidated', async () => {
		// A version page shows the current registry beneath the frozen version, so it is revalidated.
		expect((await get(`/e/${fx.potential}/v1`)).headers.get('cache-control')).toBe(
			'public, no-cache'
		);
		for (const path of [`/api/v1/entries/${fx.potential}?version=1`]) {
			const res = await get(path);
			expect(res.status, path).toBe(200);
			expect(res.headers.get('cache-control'), path).toBe('public, max-age=31536000, immutable');
			const etag = res.headers.get('etag')!;
			// Strong (no W/): the SHA-256 of the bytes; a compressed copy adds its encoding.
			expect(etag, path).toMatch(/^"[A-Za-z0-9_-]{43}(-br|-gzip)?"$/);
			expect((await get(path, { 'if-none-match': etag })).status, path).toBe(304);
		}
		expect((await get(`/e/${fx.potential}`)).headers.get('cache-control')).toBe('public, no-cache');
		expect((await get(`/api/v1/entries/${fx.potential}`)).headers.get('cache-control')).toBe(
			'public, no-cache'
		);
		const cookie = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
		const mine = await get(`/e/${fx.potential}/v1`, { cookie });
		expect(mine.headers.get('cache-control')).toBe('private, no-cache');
		expect(mine.headers.get('vary')).toMatch(/Cookie, Authorization/);
		const api = await get(`/api/v1/potentials?limit=1`, { cookie });
		expect(api.headers.get('cache-control')).toBe('private, no-cache');
		expect(api.headers.get('set-cookie')).toBeNull();
	});
});

describe('the search page', () => {
	it('pages with Next/Previous links carrying cursors, and offers all rows as CSV', async () => {
		const html = await (await get('/search?size=25')).text();
		const next = /<a href="([^"]+)"[^>]*rel="next"/.exec(html)?.[1]?.replaceAll('&amp;', '&');
		expect(next).toMatch(/^\/search\?.*cursor=/);
		expect(html).toMatch(/Rows 1–25 of \d+/);
		const total = /Rows 1–25 of (\d+)/.exec(html)![1];
		expect(html).toContain(`All ${total} rows as CSV`);
		const second = await (await get(next!)).text();
		expect(second).toMatch(/Rows 26–\d+ of /);
		expect(second).toMatch(/rel="prev"/);
	});
});
