import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { ensureDemoAccounts } from '$seed/accounts';
import { loadDemoScenario } from '$seed/load';
import { launchChromium } from '../support/browser';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/*
 * A version page is frozen: everything it cites (data block, title, <title>, the citation in
 * every format the page offers, and the versioned API answer) stays byte for byte the same after
 * a rename of the protein, a new centre on it and a potential that conflicts with the cited one
 * are approved — through the same HTTP paths a contributor and a curator use. What is live (related
 * lists, the ladder, the conflicts box) may change, and does, but only in the part of the page
 * marked as the current registry. The server runs on a database of its own: the approvals here
 * would change what other test files read.
 */
let server: RunningServer;
let dir: string;
let db: Kysely<Database>;
let base: string;
let browser: Browser;
/** A signed-out reader's tab, its clock fixed at READ_AT. */
let reader: Page;
/** A fixed reading time, so that the access date the citations carry cannot move mid-test. */
const READ_AT = new Date('2026-03-02T10:00:00Z');
let fx: { protein: string; proteinName: string; centre: string; potential: string };

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-frozen-'));
	const path = join(dir, 'f.sqlite');
	db = openDatabase(path);
	await migrateToLatest(db);
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	// The demo's respiratory complex (two versions already), its centre C1 and that centre's
	// [2Fe-2S] potential at pH 7.
	const p = await db
		.selectFrom('potential')
		.select(['accession', 'centre_accession', 'protein_accession', 'protein_name'])
		.where('protein_name', 'like', 'RoxA%')
		.where('centre_label', '=', 'C1')
		.where('ph', '=', 7)
		.executeTakeFirstOrThrow();
	fx = {
		protein: p.protein_accession,
		proteinName: p.protein_name,
		centre: p.centre_accession,
		potential: p.accession
	};
	server = await startServer(path);
	base = server.baseUrl;
	browser = await launchChromium();
	const readerContext = await browser.newContext({ baseURL: base });
	await readerContext.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: base });
	reader = await readerContext.newPage();
	await reader.clock.setFixedTime(READ_AT);
}, 120_000);

afterAll(async () => {
	await browser?.close();
	await server?.stop();
	await db?.destroy();
	rmSync(dir, { recursive: true, force: true });
});

/** Everything a frozen version page and its API answer cite. */
interface FrozenCapture {
	title: string;
	/** The server's HTML of the version's title (<h1>), beside the frozen block. */
	heading: string;
	/** The server's HTML of the headline value under the title (a potential's Em vs SHE). */
	headline: string;
	documentTitle: string;
	/** The server's HTML of the frozen block, as sent. */
	block: string;
	/** The same block in the browser, after the page’s enhancement script ran (it is not hydrated). */
	enhancedBlock: string;
	/** The citation in every format the page offers, by the format's label. */
	citations: Record<string, string>;
}

const frozenBlockOf = (html: string) =>
	/<section[^>]*data-testid="frozen-version"[^>]*>[\s\S]*?<\/section>/.exec(html)?.[0] ?? '';

async function capture(path: string): Promise<FrozenCapture> {
	const res = await fetch(`${base}${path}`);
	expect(res.status, path).toBe(200);
	const html = await res.text();
	const block = frozenBlockOf(html);
	expect(block, path).toContain('data-testid="entry-version"');

	await reader.goto(path);
	const page = reader;
	// The "How to cite" strip: the plain texts as shown, and each format of its menu as copied.
	const cite = page.getByTestId('frozen-citation');
	await cite.getByTestId('cite-accessed').filter({ hasText: 'Access date' }).waitFor();
	const citations: Record<string, string> = {};
	for (const id of ['cite-text-record', 'cite-text-original']) {
		const text = cite.getByTestId(id);
		if ((await text.count()) > 0) citations[id] = (await text.textContent())?.trim() ?? '';
	}
	const formats: [string, string][] = [
		['bib', 'BibTeX'],
		['ris', 'RIS'],
		['json', 'CSL-JSON']
	];
	for (const [extension, label] of formats) {
		await cite.getByTestId('cite-formats').click();
		await cite.getByTestId(`cite-copy-${extension}`).click();
		await cite
			.getByTestId('cite-status')
			.filter({ hasText: `${label} copied` })
			.waitFor();
		citations[extension] = await page.evaluate(() => navigator.clipboard.readText());
	}
	expect(Object.keys(citations).length, 'the page offers citation formats').toBeGreaterThanOrEqual(
		4
	);
	const captured = {
		title: /<title>([\s\S]*?)<\/title>/.exec(html)?.[1] ?? '',
		heading: /<h1[^>]*id="entry-title"[^>]*>[\s\S]*?<\/h1>/.exec(html)?.[0] ?? '',
		headline: /<div[^>]*data-testid="headline"[^>]*>[\s\S]*?<\/div>/.exec(html)?.[0] ?? '',
		documentTitle: await page.title(),
		block,
		enhancedBlock: await page.getByTestId('frozen-version').evaluate((el) => el.outerHTML),
		citations
	};
	return captured;
}

const api = async (path: string) => {
	const res = await fetch(`${base}${path}`);
	expect(res.status, path).toBe(200);
	return res.text();
};

/** The members of an unversioned API answer that belong to the version (all but `live`). */
const withoutLive = (text: string) => {
	const { live: _live, ...frozen } = JSON.parse(text) as Record<string, unknown>;
	return JSON.stringify(frozen);
};

async function signedIn(email: string, password: string) {
	return signInCookie(base, email, password);
}

/** A contributor deposits through the submissions API; a curator approves on the review page. */
async function depositAndApprove(
	contributor: string,
	curator: string,
	body: Record<string, unknown>
): Promise<string> {
	const res = await fetch(`${base}/api/v1/submissions`, {
		method: 'POST',
		headers: { origin: base, cookie: contributor, 'content-type': 'application/json' },
		body: JSON.stringify({ ...body, submit: true })
	});
	expect(res.status, await res.clone().text()).toBe(201);
	const { id, accession } = (await res.json()) as { id: number; accession: string };
	const decided = await fetch(`${base}/review/${id}?/decide`, {
		method: 'POST',
		headers: {
			origin: base,
			cookie: curator,
			'content-type': 'application/x-www-form-urlencoded',
			'x-sveltekit-action': 'true'
		},
		body: new URLSearchParams({ decision: 'approve', comment: '' })
	});
	const answer = (await decided.json()) as { type: string };
	expect(answer.type, JSON.stringify(answer)).toBe('success');
	return accession;
}

describe('a version page is frozen', () => {
	it('keeps data, titles, citations and API answers of old versions byte for byte through later approvals', async () => {
		const pages = [
			`/e/${fx.protein}/v1`,
			`/e/${fx.protein}/v2`,
			`/e/${fx.centre}/v1`,
			`/e/${fx.centre}`,
			`/e/${fx.potential}/v1`,
			`/e/${fx.potential}`
		];
		const versioned = [
			`/api/v1/entries/${fx.protein}?version=1`,
			`/api/v1/entries/${fx.protein}?version=2`,
			`/api/v1/entries/${fx.centre}?version=1`,
			`/api/v1/entries/${fx.potential}?version=1`
		];
		const latest = [`/api/v1/entries/${fx.centre}`, `/api/v1/entries/${fx.potential}`];
		const before = new Map<string, FrozenCapture>();
		for (const path of pages) before.set(path, await capture(path));
		const apiBefore = new Map<string, string>();
		for (const path of [...versioned, ...latest]) apiBefore.set(path, await api(path));
		// What the captures hold, so that equality below means something.
		const centreV1 = before.get(`/e/${fx.centre}/v1`) as FrozenCapture;
		expect(centreV1.title).toContain(fx.proteinName);
		expect(centreV1.block).toContain(fx.proteinName);
		expect(Object.values(centreV1.citations).join('\n')).toContain(fx.proteinName);
		expect(centreV1.heading).toContain(fx.proteinName);
		expect(before.get(`/e/${fx.potential}/v1`)?.headline).toContain('mV');
		expect(centreV1.citations['bib']).toContain('2026-03-02');
		const potentialV1 = JSON.parse(apiBefore.get(versioned[3] as string) as string);
		expect(potentialV1.references.centreAccession).toMatchObject({
			accession: fx.centre,
			version: 1
		});
		expect(potentialV1.live).toBeUndefined();
		const potentialPage = await (await fetch(`${base}/e/${fx.potential}/v1`)).text();
		expect(potentialPage).not.toContain('data-testid="conflict-flag"');

		// Later approvals: a rename of the protein, a new centre on it, and a value for the cited
		// potential's centre and couple that disagrees with it.
		const contributor = await signedIn('contributor@demo.hopline.test', 'demo-contributor-pass');
		const curator = await signedIn('curator@demo.hopline.test', 'demo-curator-pass');
		const proteinNow = JSON.parse(await api(`/api/v1/entries/${fx.protein}`));
		const renamed = 'Renamed respiratory complex (frozen-versions test)';
		await depositAndApprove(contributor, curator, {
			kind: 'protein',
			edit: fx.protein,
			data: { ...proteinNow.data, name: renamed },
			changeNote: 'Renamed.'
		});
		const newCentre = await depositAndApprove(contributor, curator, {
			kind: 'centre',
			data: {
				proteinAccession: fx.protein,
				label: 'C9-late',
				cofactorKind: 'fe4s4',
				ligation: 'Cys4'
			}
		});
		const cited = JSON.parse(apiBefore.get(versioned[3] as string) as string).data;
		const conflicting = await depositAndApprove(contributor, curator, {
			kind: 'potential',
			data: {
				centreAccession: fx.centre,
				couple: cited.couple,
				reportedValue: cited.emMvShe + 150,
				reportedUnit: 'mV',
				referenceElectrode: 'SHE',
				ph: cited.ph,
				temperatureK: cited.temperatureK,
				method: 'epr_titration',
				uncertaintyMv: 5
			}
		});

		// The changes are there…
		const proteinAfter = JSON.parse(await api(`/api/v1/entries/${fx.protein}`));
		expect(proteinAfter.title).toBe(renamed);
		expect(proteinAfter.version).toBe(3);
		const centreAfter = JSON.parse(await api(`/api/v1/entries/${fx.centre}`));
		expect(centreAfter.live.newerReferences).toEqual({ proteinAccession: 3 });

		// …and nothing a version cites moved.
		for (const path of versioned) expect(await api(path), path).toBe(apiBefore.get(path));
		for (const path of latest)
			expect(withoutLive(await api(path)), path).toBe(withoutLive(apiBefore.get(path) as string));
		for (const path of pages) {
			const after = await capture(path);
			const was = before.get(path) as FrozenCapture;
			expect(after.title, path).toBe(was.title);
			expect(after.heading, path).toBe(was.heading);
			expect(after.headline, path).toBe(was.headline);
			expect(after.documentTitle, path).toBe(was.documentTitle);
			expect(after.block, path).toBe(was.block);
			expect(after.enhancedBlock, path).toBe(was.enhancedBlock);
			expect(after.citations, path).toEqual(was.citations);
			expect(after.block, path).not.toContain(renamed);
		}

		// What is live shows the later approvals, apart from the frozen version and labelled so.
		const proteinPage = await (await fetch(`${base}/e/${fx.protein}/v1`)).text();
		// The live part comes last in the page (after the citation, on small screens too).
		const live = (html: string) =>
			/<section[^>]*data-testid="live-sections"[\s\S]*?<\/article>/.exec(html)?.[0] ?? '';
		expect(live(proteinPage)).toContain(newCentre);
		expect(live(proteinPage)).toContain('not part of version 1');
		expect(frozenBlockOf(proteinPage)).not.toContain(newCentre);
		const potentialAfter = await (await fetch(`${base}/e/${fx.potential}/v1`)).text();
		expect(frozenBlockOf(potentialAfter)).not.toContain('conflict-flag');
		expect(live(potentialAfter)).toContain('data-testid="conflict-flag"');
		expect(live(potentialAfter)).toContain(conflicting);
		const centrePage = await (await fetch(`${base}/e/${fx.centre}/v1`)).text();
		expect(live(centrePage)).toContain('data-testid="newer-references"');
		expect(live(centrePage)).toContain(conflicting);

		// The old version of the demo protein, as a reader sees it now.
		for (const width of [1366, 390]) {
			const context = await browser.newContext({ baseURL: base, viewport: { width, height: 900 } });
			const page = await context.newPage();
			await page.goto(`/e/${fx.protein}/v1`);
			await page.screenshot({
				path: `test-results/frozen-old-version-${width}.png`,
				fullPage: true
			});
			await context.close();
		}
	}, 180_000);
});
