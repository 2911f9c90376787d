import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import {
	buildHiddenFixtures,
	HIDDEN_MARKS,
	OUTSIDERS,
	type HiddenFixtures
} from '../support/hiddenFixtures';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/**
 * Entries only a group may see, read by four people outside it (signed out, a reader, a
 * contributor, an admin): no page, API answer, CSV export, search, count, warning or error
 * message may reveal them — not their values, not their accessions, not even their kind or
 * existence. A member of the group is the control: the fixtures are really there.
 */
let server: RunningServer;
let dir: string;
let fx: HiddenFixtures;
let base: string;
const cookies: Record<string, string> = {};
const OUTSIDE = ['signed out', 'outside reader', 'outside contributor', 'admin outside'] as const;
const CONTRIBUTING = ['outside contributor', 'admin outside'] as const;

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-confidential-'));
	const path = join(dir, 'c.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	fx = await buildHiddenFixtures(db);
	await db.destroy();
	server = await startServer(path);
	base = server.baseUrl;
	cookies['signed out'] = '';
	cookies['outside reader'] = await signInCookie(
		base,
		OUTSIDERS.reader.email,
		OUTSIDERS.reader.password
	);
	cookies['outside contributor'] = await signInCookie(
		base,
		OUTSIDERS.contributor.email,
		OUTSIDERS.contributor.password
	);
	cookies['admin outside'] = await signInCookie(base, 'admin@demo.hopline.test', 'demo-admin-pass');
	cookies.member = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
	cookies['member contributor'] = await signInCookie(
		base,
		'contributor@demo.hopline.test',
		'demo-contributor-pass'
	);
}, 120_000);

afterAll(async () => {
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

const get = (path: string, cookie: string) =>
	fetch(`${base}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });

const post = (path: string, cookie: string, body: unknown) =>
	fetch(`${base}${path}`, {
		method: 'POST',
		headers: { origin: base, cookie, 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});

/** Everything that would give a hidden entry away if it appeared in a response. */
function secrets(): string[] {
	return [
		HIDDEN_MARKS.sourceDoi,
		HIDDEN_MARKS.sourceAuthor.split(',')[0] as string,
		HIDDEN_MARKS.centreLabel,
		'777.7',
		'666.6',
		'Hiddenase',
		'hiddenensis',
		fx.hiddenPotential,
		fx.embargoedPotential,
		fx.hiddenSource,
		fx.hiddenCentre,
		fx.hiddenProtein
	];
}

function expectNoSecret(text: string, where: string) {
	for (const s of secrets()) expect(text, `${where} reveals ${s}`).not.toContain(s);
}

/**
 * Replaces the accession in an answer, and what differs on every response (per-request error
 * ids, CSP nonces), so answers for two accessions can be compared.
 */
const blank = (text: string, accession: string) =>
	text
		.replaceAll(accession, 'HL______')
		.replace(/nonce="[^"]*"/g, 'nonce')
		.replace(/nonce-[A-Za-z0-9+/=]+/g, 'nonce')
		.replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, 'ID');

/** A valid potential on the public centre (the API's input shape). */
function potentialData(overrides: Record<string, unknown> = {}) {
	return {
		centreAccession: fx.publicCentre,
		couple: fx.publicCentreCouple,
		reportedValue: -300,
		reportedUnit: 'mV',
		referenceElectrode: 'SHE',
		ph: 7,
		temperatureK: 298.15,
		method: 'epr_titration',
		...overrides
	};
}

describe('hidden entries, read from outside their group', () => {
	it('are really there for a member (the control)', async () => {
		for (const accession of [fx.hiddenPotential, fx.hiddenSource, fx.hiddenCentre]) {
			expect((await get(`/e/${accession}`, cookies.member as string)).status).toBe(200);
		}
		const page = await (
			await get(`/e/${fx.potentialCitingHiddenSource}`, cookies.member as string)
		).text();
		expect(page).toContain(fx.hiddenSource);
		const api = await (
			await get(`/api/v1/potentials?centre=${fx.publicCentre}&limit=100`, cookies.member as string)
		).text();
		expect(api).toContain(HIDDEN_MARKS.sourceDoi);
		expect(api).toContain(fx.hiddenPotential);
		// A member finds the potential citing the group-only source by its author and its DOI.
		for (const q of [HIDDEN_MARKS.sourceAuthor.split(',')[0]!, HIDDEN_MARKS.sourceDoi]) {
			const found = await (
				await get(`/api/v1/potentials?q=${encodeURIComponent(q)}`, cookies.member as string)
			).text();
			expect(found, q).toContain(fx.potentialCitingHiddenSource);
		}
	});

	for (const who of OUTSIDE) {
		it(`answer ${who} exactly as an entry that does not exist`, async () => {
			const cookie = cookies[who] as string;
			const missing = 'HL999998';
			const page404 = await get(`/e/${missing}`, cookie);
			const api404 = await get(`/api/v1/entries/${missing}`, cookie);
			const pageText = blank(await page404.text(), missing);
			const apiText = blank(await api404.text(), missing);
			for (const accession of [
				fx.hiddenPotential,
				fx.embargoedPotential,
				fx.hiddenSource,
				fx.hiddenCentre,
				fx.hiddenProtein
			]) {
				const page = await get(`/e/${accession}`, cookie);
				expect(page.status).toBe(404);
				const api = await get(`/api/v1/entries/${accession}`, cookie);
				expect(api.status).toBe(404);
				expect(blank(await api.text(), accession)).toBe(apiText);
				for (const path of [
					`/e/${accession}/v1`,
					`/e/${accession}/compare?from=1&to=1`,
					`/e/${accession}/v1/cite.bib`,
					`/e/${accession}/cite.ris`
				])
					expect((await get(path, cookie)).status, path).toBe(404);
				// Filters naming a hidden entry answer as for an unknown one: nothing.
				for (const filter of ['centre', 'protein']) {
					const list = (await (
						await get(`/api/v1/potentials?${filter}=${accession}`, cookie)
					).json()) as { total: number };
					expect(list.total).toBe(0);
				}
				const text = blank(await page.text(), accession);
				const want = pageText;
				if (text !== want) {
					const at = [...text].findIndex((c, i) => c !== want[i]);
					expect(text.slice(at - 200, at + 200)).toBe(want.slice(at - 200, at + 200));
				}
			}
		});

		it(`keep every value, accession, source and count from ${who} on public paths`, async () => {
			const cookie = cookies[who] as string;
			const paths = [
				`/e/${fx.publicCentre}`,
				`/e/${fx.publicProtein}`,
				`/e/${fx.potentialCitingHiddenSource}`,
				`/e/${fx.potentialCitingHiddenSource}/v1`,
				`/e/${fx.potentialCitingHiddenSource}/v1/cite.bib`,
				`/e/${fx.potentialCitingHiddenSource}/v1/cite.ris`,
				`/e/${fx.potentialCitingHiddenSource}/v1/cite.json`,
				`/search`,
				`/search?q=${fx.publicCentre}`,
				`/proteins`,
				`/`,
				`/api/v1/potentials?limit=100`,
				`/api/v1/potentials?centre=${fx.publicCentre}&limit=100`,
				`/api/v1/potentials?centre=${fx.publicCentre}&limit=100&format=csv`,
				`/api/v1/entries/${fx.potentialCitingHiddenSource}`,
				`/api/v1/proteins?limit=100`,
				`/api/v1/centres?protein=${fx.publicProtein}&limit=100`,
				`/api/v1/spin-records?limit=100`,
				`/api/v1/distances?limit=100`,
				`/api/v1/facets`
			];
			for (const path of paths) {
				const res = await get(path, cookie);
				expect(res.status, path).toBe(200);
				expectNoSecret(await res.text(), path);
			}
			// Searching for a hidden centre's label finds nothing, not even its protein.
			const byLabel = (await (
				await get(`/api/v1/proteins?q=${HIDDEN_MARKS.centreLabel}`, cookie)
			).json()) as { total: number };
			expect(byLabel.total).toBe(0);
			for (const q of [HIDDEN_MARKS.centreLabel, 'Hiddenase', 'hiddenensis']) {
				for (const list of ['potentials', 'centres', 'proteins']) {
					const found = (await (await get(`/api/v1/${list}?q=${q}`, cookie)).json()) as {
						total: number;
					};
					expect(found.total, `${list}?q=${q}`).toBe(0);
				}
				const page = await get(`/search?q=${q}`, cookie);
				// The reader's own query comes back in the search box, nothing else may.
				expectNoSecret((await page.text()).replaceAll(q, 'QUERY'), `/search?q=${q}`);
			}
			// A public potential citing a group-only source is not found by that source's author,
			// year-less surname or DOI, and facet counts within a search count only what the reader
			// may see (the member's check below shows the same queries do find it).
			const surname = HIDDEN_MARKS.sourceAuthor.split(',')[0]!;
			for (const q of [surname, HIDDEN_MARKS.sourceDoi]) {
				const query = encodeURIComponent(q);
				const found = (await (await get(`/api/v1/potentials?q=${query}`, cookie)).json()) as {
					total: number;
				};
				expect(found.total, `potentials?q=${q}`).toBe(0);
				const facets = (await (await get(`/api/v1/facets?q=${query}`, cookie)).json()) as {
					kinds: unknown[];
					totals: { potentials: number };
				};
				expect(facets.totals.potentials, `facets?q=${q}`).toBe(0);
				expect(facets.kinds, `facets?q=${q}`).toEqual([]);
			}
			const onCentre = (await (
				await get(`/api/v1/potentials?centre=${fx.publicCentre}&limit=1`, cookie)
			).json()) as { total: number };
			const centreFacets = (await (
				await get(`/api/v1/facets?centre=${fx.publicCentre}`, cookie)
			).json()) as { totals: { potentials: number }; kinds: { count: number }[] };
			expect(centreFacets.totals.potentials).toBe(onCentre.total);
			expect(centreFacets.kinds.reduce((n, k) => n + k.count, 0)).toBe(onCentre.total);
			// A protein's centre count counts only centres the reader may see.
			const proteins = (await (await get(`/api/v1/proteins?limit=100`, cookie)).json()) as {
				items: { accession: string; centreCount: number }[];
			};
			const centres = (await (
				await get(`/api/v1/centres?protein=${fx.publicProtein}&limit=100`, cookie)
			).json()) as { total: number };
			expect(proteins.items.find((p) => p.accession === fx.publicProtein)?.centreCount).toBe(
				centres.total
			);
		});
	}
});

describe('accessions sent by contributors outside the group', () => {
	for (const who of CONTRIBUTING) {
		it(`${who}: a proposed change to a hidden, pending or unknown entry gets one answer`, async () => {
			const cookie = cookies[who] as string;
			const answer = async (edit: string) => {
				const res = await post('/api/v1/submissions', cookie, {
					kind: 'potential',
					data: potentialData(),
					edit
				});
				return { status: res.status, text: blank(await res.text(), edit) };
			};
			const missing = await answer('HL999997');
			expect(missing.status).toBe(400);
			// A pending accession of another contributor (not approved yet) is no target either.
			const pending = (await (
				await post('/api/v1/submissions', cookies['member contributor'] as string, {
					kind: 'potential',
					data: potentialData({ reportedValue: -301 })
				})
			).json()) as { accession: string };
			for (const edit of [
				fx.hiddenPotential,
				fx.embargoedPotential,
				// a hidden entry of another kind: its kind must not show either
				fx.hiddenCentre,
				fx.hiddenSource,
				pending.accession
			]) {
				expect(await answer(edit), edit).toEqual(missing);
			}
			// The form route answers alike: 404, the same page for both.
			const form = async (edit: string) => {
				const res = await get(`/submissions/new/potential?edit=${edit}`, cookie);
				return { status: res.status, text: blank(await res.text(), edit) };
			};
			const formMissing = await form('HL999997');
			expect(formMissing.status).toBe(404);
			expect(await form(fx.hiddenPotential)).toEqual(formMissing);
			expect(await form(pending.accession)).toEqual(formMissing);
		});

		it(`${who}: references to hidden entries read as missing ones`, async () => {
			const cookie = cookies[who] as string;
			const refer = async (field: string, accession: string) => {
				const res = await post('/api/v1/submissions', cookie, {
					kind: 'potential',
					data: potentialData({ [field]: accession }),
					submit: true
				});
				return { status: res.status, text: blank(await res.text(), accession) };
			};
			const noCentre = await refer('centreAccession', 'HL999996');
			expect(noCentre.status).toBe(400);
			expect(await refer('centreAccession', fx.hiddenCentre)).toEqual(noCentre);
			expect(await refer('centreAccession', fx.hiddenPotential)).toEqual(noCentre);
			const noSource = await refer('sourceAccession', 'HL999996');
			expect(noSource.status).toBe(400);
			expect(await refer('sourceAccession', fx.hiddenSource)).toEqual(noSource);
		});

		it(`${who}: the CSV check and the submission's warnings name no hidden value`, async () => {
			const cookie = cookies[who] as string;
			const csv = [
				'centreAccession,couple,reportedValue (mV),referenceElectrode,ph,temperatureK,method,uncertaintyMv',
				// the hidden value itself (a duplicate, were it visible) …
				`${fx.publicCentre},${fx.publicCentreCouple},${HIDDEN_MARKS.potentialReported},SHE,7,298.15,epr_titration,5`,
				// … and one that conflicts with it
				`${fx.publicCentre},${fx.publicCentreCouple},-700,SHE,7,298.15,epr_titration,5`,
				`${fx.hiddenCentre},${fx.publicCentreCouple},-300,SHE,7,298.15,epr_titration,5`
			].join('\n');
			const form = new FormData();
			form.set('kind', 'potential');
			form.set('file', new Blob([csv], { type: 'text/csv' }), 'p.csv');
			const res = await fetch(`${base}/api/v1/uploads/check`, {
				method: 'POST',
				headers: { origin: base, cookie },
				body: form
			});
			expect(res.status).toBe(200);
			const text = await res.text();
			// The uploader's own value equals the hidden one; it may of course come back to them.
			expectNoSecret(
				text.replaceAll('777.7', 'VALUE').replaceAll(fx.hiddenCentre, 'TYPED'),
				'CSV check'
			);
			const report = JSON.parse(text) as {
				issues: { row: number; message: string; severity: string }[];
			};
			// Each warning that names an entry names one the reader can see.
			const visible = await (
				await get(`/api/v1/potentials?centre=${fx.publicCentre}&limit=100`, cookie)
			).text();
			for (const issue of report.issues.filter((i) => i.severity === 'warning')) {
				for (const named of issue.message.match(/HL\d{6,}/g) ?? [])
					expect(visible, issue.message).toContain(named);
			}
			// The hidden centre reads as a missing one.
			expect(report.issues.find((i) => i.row === 4)?.message).toBe(
				`no centre ${fx.hiddenCentre} in the registry (or not visible to you)`
			);

			const submitted = await post('/api/v1/submissions', cookie, {
				kind: 'potential',
				data: potentialData({ reportedValue: -700, uncertaintyMv: 5 }),
				submit: true
			});
			expect(submitted.status).toBe(201);
			const body = await submitted.text();
			expectNoSecret(body, 'submission warnings');
			const mine = await (await get('/submissions', cookie)).text();
			expectNoSecret(mine, 'own submission list');
		});
	}
});
