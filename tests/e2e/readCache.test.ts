import { mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { DEMO_GROUP, ensureDemoAccounts } from '$seed/accounts';
import { loadDemoScenario } from '$seed/load';
import { potentialAtPh7 } from '../support/largeCentre';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/**
 * The answers kept for signed-out readers (src/lib/server/http/readCache.ts) change exactly
 * when what they show changes. Every write here comes from this test process, not the server:
 * the server learns of it only through the catalogue revision in the database, as a second
 * server process on the same file would.
 */
let server: RunningServer;
let dir: string;
let db: Kysely<Database>;
let base: string;
let fx: { protein: string; potential: string; potentialId: number; centre: string; couple: string };

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-read-cache-'));
	const path = join(dir, 'r.sqlite');
	db = openDatabase(path);
	await migrateToLatest(db);
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	const row = await db
		.selectFrom('potential')
		.select(['accession', 'entry_id', 'protein_accession', 'centre_accession', 'couple'])
		.where('version', '=', 1)
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	fx = {
		protein: row.protein_accession,
		potential: row.accession,
		potentialId: row.entry_id,
		centre: row.centre_accession,
		couple: row.couple
	};
	server = await startServer(path);
	base = server.baseUrl;
}, 120_000);

afterAll(async () => {
	await server?.stop();
	await db?.destroy();
	rmSync(dir, { recursive: true, force: true });
});

/** The page's text as a reader sees it, without markup or the serialised data. */
const visibleText = (html: string) =>
	html
		.replace(/<script[\s\S]*?<\/script>/g, ' ')
		.replace(/<[^>]+>/g, ' ')
		.replace(/\s+/g, ' ');

const get = (path: string, headers: Record<string, string> = {}) =>
	fetch(`${base}${path}`, { headers, redirect: 'manual' });

async function approveNewVersion(reportedValue: number): Promise<void> {
	await db.transaction().execute(async (trx) => {
		const versionId = await addVersion(
			trx,
			fx.potentialId,
			potentialAtPh7(fx.centre, fx.couple, reportedValue),
			{ status: 'submitted', visibility: null }
		);
		await approveVersion(trx, versionId);
	});
}

describe('answers kept for signed-out readers', () => {
	it('serves the same bytes again, with an ETag, and 304 to a matching If-None-Match', async () => {
		const first = await get(`/e/${fx.protein}`);
		expect(first.status).toBe(200);
		const etag = first.headers.get('etag');
		expect(etag).toMatch(/^"[^"]+"$/);
		expect(first.headers.get('cache-control')).toBe('public, no-cache');
		expect(first.headers.get('vary')).toMatch(/Cookie, Authorization/);
		expect(first.headers.get('set-cookie')).toBeNull();
		const body = await first.text();

		const second = await get(`/e/${fx.protein}`);
		expect(second.headers.get('etag')).toBe(etag);
		expect(await second.text()).toBe(body);
		// Security headers are set on each answer, kept or not.
		// (An entry page is a document without SvelteKit's inline start-up script: no hashes.)
		expect(second.headers.get('content-security-policy')).toMatch(/script-src 'self'/);
		expect(second.headers.get('content-security-policy')).not.toMatch(/unsafe-inline/);
		expect(second.headers.get('x-content-type-options')).toBe('nosniff');

		const revalidated = await get(`/e/${fx.protein}`, { 'if-none-match': etag as string });
		expect(revalidated.status).toBe(304);
		expect(await revalidated.text()).toBe('');
		const other = await get(`/e/${fx.protein}`, { 'if-none-match': '"something-else"' });
		expect(other.status).toBe(200);
	});

	it('shows an approval on the next request; the old version keeps its frozen data', async () => {
		const apiV1Before = await (await get(`/api/v1/entries/${fx.potential}?version=1`)).text();
		const pageV1Before = await (await get(`/e/${fx.potential}/v1`)).text();
		const proteinBefore = await get(`/e/${fx.protein}`);
		const etagBefore = proteinBefore.headers.get('etag') as string;
		expect(visibleText(await proteinBefore.text())).not.toContain('−432 mV');
		const listBefore = await (
			await get(`/api/v1/potentials?protein=${fx.protein}&limit=100`)
		).json();

		await approveNewVersion(-432);

		const proteinAfter = await get(`/e/${fx.protein}`, { 'if-none-match': etagBefore });
		expect(proteinAfter.status).toBe(200);
		expect(proteinAfter.headers.get('etag')).not.toBe(etagBefore);
		expect(visibleText(await proteinAfter.text())).toContain('−432 mV');
		const listAfter = await (
			await get(`/api/v1/potentials?protein=${fx.protein}&limit=100`)
		).json();
		const changed = listAfter.items.find(
			(p: { accession: string }) => p.accession === fx.potential
		);
		expect(changed.emMvShe).toBe(-432);
		expect(changed.version).toBe(2);
		expect(listAfter).not.toEqual(listBefore);

		// The frozen version: the same answer from the API, byte for byte (the latest version is
		// in the unversioned answer's `live`); the page still shows the value of version 1.
		const apiV1After = await (await get(`/api/v1/entries/${fx.potential}?version=1`)).text();
		expect(apiV1After).toBe(apiV1Before);
		const latest = await (await get(`/api/v1/entries/${fx.potential}`)).json();
		expect(latest.live.latestVersion).toBe(2);
		const pageV1After = await (await get(`/e/${fx.potential}/v1`)).text();
		expect(visibleText(pageV1After)).not.toContain('−432 mV');
		const dataBlock = (html: string) => /<dl[\s\S]*?<\/dl>/.exec(html)?.[0];
		expect(dataBlock(pageV1After)).toBe(dataBlock(pageV1Before));
	});

	it('never serves a kept answer to someone signed in, nor keeps theirs', async () => {
		const signedOut = await (await get(`/e/${fx.protein}`)).text();
		expect(signedOut).toContain('Sign in');
		const cookie = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
		const member = await get(`/e/${fx.protein}`, { cookie });
		expect(member.status).toBe(200);
		// Not a kept answer (those are `public, no-cache`): the member's copy is private, and the
		// read cache never keeps what is private (entry pages also vary with Accept).
		expect(member.headers.get('cache-control')).toBe('private, no-cache');
		expect(member.headers.get('vary')).toBe('Accept, Cookie, Authorization');
		const memberBody = await member.text();
		expect(memberBody).not.toBe(signedOut);
		expect(memberBody).toContain('data-testid="user-menu"');
		// …and the signed-out answer is not the member's.
		expect(await (await get(`/e/${fx.protein}`)).text()).toBe(signedOut);
		// A request with credentials of any kind (here a proxy's Basic credentials, which the API
		// passes through) is answered afresh, and privately (http/caching.ts
		// tags it by the reader's groups, never from the answers kept for signed-out readers).
		const bearer = await get(`/api/v1/potentials?limit=1`, { authorization: 'Basic dXNlcjpwYXNz' });
		expect(bearer.headers.get('cache-control')).toBe('private, no-cache');
	});

	it('shows an entry whose embargo ends, without any write', async () => {
		const group = await db
			.selectFrom('research_group')
			.select('id')
			.where('slug', '=', DEMO_GROUP.slug)
			.executeTakeFirstOrThrow();
		const embargoUntil = new Date(Date.now() + 4000).toISOString();
		const accession = await db.transaction().execute(async (trx) => {
			const entry = await createEntry(trx, { kind: 'potential' });
			const versionId = await addVersion(
				trx,
				entry.id,
				potentialAtPh7(fx.centre, fx.couple, -123.4),
				{
					status: 'submitted',
					visibility: { visibility: 'embargoed', groupId: group.id, embargoUntil }
				}
			);
			await approveVersion(trx, versionId);
			return entry.accession;
		});
		const listPath = `/api/v1/potentials?centre=${fx.centre}&limit=100`;
		const hidden = await (await get(listPath)).json();
		expect(hidden.items.map((p: { accession: string }) => p.accession)).not.toContain(accession);
		expect((await get(`/e/${fx.centre}`)).status).toBe(200); // kept now, under this revision

		await new Promise((r) => setTimeout(r, Date.parse(embargoUntil) - Date.now() + 200));
		const shown = await (await get(listPath)).json();
		expect(shown.items.map((p: { accession: string }) => p.accession)).toContain(accession);
		expect(await (await get(`/e/${fx.centre}`)).text()).toContain(accession);
	});

	it('keeps a page and its __data.json apart', async () => {
		for (let round = 0; round < 2; round++) {
			const html = await get(`/e/${fx.protein}`);
			expect(html.headers.get('content-type')).toMatch(/^text\/html/);
			const data = await get(`/e/${fx.protein}/__data.json`);
			expect(data.headers.get('content-type')).toMatch(/^application\/json/);
			expect((await data.json()).type).toBe('data');
			const search = await get('/search/__data.json?kind=fe4s4');
			expect(search.headers.get('content-type')).toMatch(/^application\/json/);
			expect((await get('/search?kind=fe4s4')).headers.get('content-type')).toMatch(/^text\/html/);
		}
	});

	it('sends kept answers compressed to clients that accept it, decoded to the same bytes', async () => {
		const path = `/e/${fx.protein}`;
		// node:http does not decode, so what goes over the wire is seen as it is.
		const raw = (acceptEncoding: string | null, ifNoneMatch?: string) =>
			new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }>(
				(done, fail) => {
					const headers: Record<string, string> = {};
					if (acceptEncoding !== null) headers['accept-encoding'] = acceptEncoding;
					if (ifNoneMatch) headers['if-none-match'] = ifNoneMatch;
					http
						.get(`${base}${path}`, { headers }, (res) => {
							const chunks: Buffer[] = [];
							res.on('data', (c: Buffer) => chunks.push(c));
							res.on('end', () =>
								done({
									status: res.statusCode ?? 0,
									headers: res.headers,
									body: Buffer.concat(chunks)
								})
							);
						})
						.on('error', fail);
				}
			);
		const plain = await raw(null);
		expect(plain.headers['content-encoding']).toBeUndefined();
		expect(plain.headers.vary).toContain('Accept-Encoding');
		const br = await raw('gzip, deflate, br');
		expect(br.headers['content-encoding']).toBe('br');
		expect(brotliDecompressSync(br.body).equals(plain.body)).toBe(true);
		expect(br.body.length).toBeLessThan(plain.body.length / 3);
		expect(Number(br.headers['content-length'])).toBe(br.body.length);
		const gz = await raw('gzip');
		expect(gz.headers['content-encoding']).toBe('gzip');
		expect(gunzipSync(gz.body).equals(plain.body)).toBe(true);
		// One ETag per representation; each revalidates only itself.
		const tags = new Set([plain.headers.etag, br.headers.etag, gz.headers.etag]);
		expect(tags.size).toBe(3);
		expect((await raw('br', br.headers.etag)).status).toBe(304);
		expect((await raw(null, br.headers.etag)).status).toBe(200);
	});

	it('keeps no error answers', async () => {
		const missing = await get('/e/HL999999');
		expect(missing.status).toBe(404);
		expect(missing.headers.get('vary')).toBeNull();
		const bad = await get('/api/v1/potentials?limit=0');
		expect(bad.status).toBe(400);
		expect(bad.headers.get('vary')).toBeNull();
	});
});
