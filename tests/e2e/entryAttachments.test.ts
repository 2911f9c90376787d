import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import type { Kysely } from 'kysely';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { carryForward, createAttachment, listOnVersion } from '$lib/server/attachments/attachments';
import { diskStore } from '$lib/server/attachments/diskStore';
import { closeImagePool, renderImage } from '$lib/server/attachments/imaging';
import { loadSessionUser } from '$lib/server/auth/users';
import { openDatabase } from '$lib/server/db/connect';
import type { Database } from '$lib/server/db/schema';
import { entryAnswerSchema } from '$lib/catalogue/dto';
import { seriousViolations } from '../support/axe';
import { launchChromium, signedInPage } from '../support/browser';
import { pngOf } from '../support/hostileFiles';
import { startServer, type RunningServer } from '../support/server';

/*
 * The demo's spectra as readers and curators see them, in Chromium against the production build:
 * the entry page's Evidence section with its plot drawn on the server, zoom and values by the
 * page's own plot script (under the site's CSP), downloads, the page without scripts; the entry
 * API's list; and the curator's review of a change that adds one file and drops another.
 */
const base = inject('baseUrl');
const WIDE = { width: 1366, height: 900 };
const PHONE = { width: 390, height: 844 };

let browser: Browser;
/** Demo entries carrying spectra, found through the API (seed/spectra.ts says which). */
let epr: string;
let cv: string;

async function entry(accession: string) {
	const res = await fetch(`${base}/api/v1/entries/${accession}`);
	expect(res.status).toBe(200);
	return entryAnswerSchema.parse(await res.json());
}

/** Accessions of the demo's spin records and potentials that list attachments. */
async function withAttachments(list: string): Promise<string[]> {
	const res = await fetch(`${base}/api/v1/${list}?limit=500`);
	const { items } = (await res.json()) as { items: { accession: string }[] };
	const found: string[] = [];
	for (const { accession } of items)
		if ((await entry(accession)).attachments.length > 0) found.push(accession);
	return found;
}

beforeAll(async () => {
	browser = await launchChromium();
	epr = (await withAttachments('spin-records'))[0] ?? 'none';
	cv = (await withAttachments('potentials'))[0] ?? 'none';
}, 60_000);
afterAll(async () => browser?.close());

async function open(
	path: string,
	viewport = WIDE,
	options: { javaScriptEnabled?: boolean; bypassCSP?: boolean } = {}
): Promise<Page> {
	const context = await browser.newContext({
		baseURL: base,
		viewport,
		acceptDownloads: true,
		bypassCSP: options.bypassCSP ?? false,
		javaScriptEnabled: options.javaScriptEnabled ?? true
	});
	const page = await context.newPage();
	await page.goto(path);
	return page;
}

describe('the entry API', () => {
	it('lists the version’s files with absolute URLs, sizes, types and checksums', async () => {
		expect(epr).toMatch(/^HL\d{6}$/);
		const answer = await entry(epr);
		const [a] = answer.attachments;
		expect(a).toMatchObject({ kind: 'epr_spectrum', role: 'image', mediaType: 'image/png' });
		expect(a?.urls.original).toBe(`${base}/files/${a?.id}/original`);
		expect(a?.conditions.microwaveFrequencyGHz).toBe(9.4);
		// The numbers file served is the one described, byte for byte.
		const data = await fetch(a?.urls.data ?? '');
		const bytes = new Uint8Array(await data.arrayBuffer());
		expect(bytes.byteLength).toBe(a?.numbers?.byteSize);
		// A versioned answer carries the same frozen list.
		const v1 = entryAnswerSchema.parse(
			await (await fetch(`${base}/api/v1/entries/${epr}?version=1`)).json()
		);
		expect(v1.attachments).toEqual(answer.attachments);
	});
});

describe('an entry page with a spectrum', () => {
	it('draws the plot on the server with its g axis, labelled as the contributor’s data', async () => {
		const page = await open(`/e/${epr}`, WIDE, { javaScriptEnabled: false });
		const evidence = page.getByTestId('evidence');
		expect(await evidence.getByTestId('attachment').count()).toBe(1);
		const text = (await evidence.textContent()) ?? '';
		expect(text).toContain('EPR spectrum');
		expect(text).toContain('9.4\u00a0GHz');
		expect(text).toContain('supplied by the contributor');
		expect(text).toContain('g = hν/(μ_B·B) at 9.4 GHz');
		// Without scripts: no buttons that do nothing, but the plot and both downloads.
		expect(await evidence.locator('button').count()).toBe(0);
		expect(await evidence.locator('svg path[data-paint]').getAttribute('d')).toMatch(/^M[\d.]+,/);
		const dataHref = await evidence.locator('[data-spectrum-data]').getAttribute('href');
		expect(dataHref).toMatch(/^\/files\/\d+\/data$/);
		const original = await evidence.getByTestId('attachment-original').getAttribute('href');
		const res = await fetch(`${base}${original}`);
		expect(res.headers.get('content-type')).toBe('image/png');
		await page.screenshot({ path: 'test-results/entry-attachments-noscript.png', fullPage: true });
		await page.context().close();
	});

	it('zooms by a drag, reads values on hover and by keyboard, and downloads SVG, PNG and numbers', async () => {
		const page = await open(`/e/${epr}`);
		const errors: string[] = [];
		page.on('pageerror', (e) => errors.push(String(e)));
		const plot = page.locator('[data-spectrum-plot] svg');
		await page.getByRole('button', { name: 'Reset zoom' }).waitFor();
		const ticks = () =>
			plot.locator('text[data-paint]').evaluateAll((ts) => ts.map((t) => t.textContent));
		const before = await ticks();
		await plot.scrollIntoViewIfNeeded();
		const box = await plot.boundingBox();
		if (!box) throw new Error('no plot box');
		// Hover: the values of the nearest point, with its g.
		await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5);
		const readout = page.locator('[data-spectrum-readout]');
		await expect.poll(() => readout.textContent()).toMatch(/Field \(mT\): [\d.]+; .*g = \d\.\d{4}/);
		// Drag across a third of the plot: the axis is redrawn over the narrower range.
		await page.mouse.move(box.x + box.width * 0.35, box.y + box.height * 0.5);
		await page.mouse.down();
		await page.mouse.move(box.x + box.width * 0.65, box.y + box.height * 0.5, { steps: 5 });
		await page.mouse.up();
		await expect.poll(ticks).not.toEqual(before);
		const reset = page.getByRole('button', { name: 'Reset zoom' });
		expect(await reset.isEnabled()).toBe(true);
		await reset.click();
		await expect.poll(ticks).toEqual(before);
		// Keyboard: focus, → picks the first point, + zooms in, 0 resets.
		await plot.focus();
		await page.keyboard.press('ArrowRight');
		expect(await plot.getAttribute('aria-valuetext')).toMatch(/^Field \(mT\)/);
		await page.keyboard.press('+');
		await expect.poll(ticks).not.toEqual(before);
		await page.keyboard.press('0');
		await expect.poll(ticks).toEqual(before);

		const saved = async (name: string) => {
			const [download] = await Promise.all([
				page.waitForEvent('download'),
				page.getByRole('button', { name }).click()
			]);
			return readFileSync((await download.path()) ?? '');
		};
		const svg = (await saved('Download SVG')).toString('utf8');
		expect(svg).toMatch(/^<svg[^>]*xmlns="http:\/\/www.w3.org\/2000\/svg"/);
		expect(svg).not.toContain('data-interactive');
		const png = await saved('Download PNG');
		expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
		const [numbers] = await Promise.all([
			page.waitForEvent('download'),
			page.locator('[data-spectrum-data]').click()
		]);
		const csv = readFileSync((await numbers.path()) ?? '', 'utf8');
		expect(csv.split('\n')[0]).toBe('Field (mT),dχ″/dB (a.u.)');
		expect(csv.trim().split('\n').length).toBeGreaterThan(500);
		expect(errors).toEqual([]);
		await page.screenshot({ path: 'test-results/entry-attachments-wide.png', fullPage: true });
		await page.context().close();
	});

	it('draws a voltammogram against SHE through the stated electrode, fits a phone, and has no serious axe violations', async () => {
		const page = await open(`/e/${cv}`, PHONE, { bypassCSP: true });
		await page.getByRole('button', { name: 'Reset zoom' }).waitFor();
		const evidence = page.getByTestId('evidence');
		expect(await evidence.textContent()).toContain('Potential (mV vs SHE)');
		expect(await evidence.textContent()).toMatch(/converted from V vs Ag\/AgCl/);
		expect(await page.evaluate(() => document.documentElement.scrollWidth - innerWidth)).toBe(0);
		expect(await seriousViolations(page)).toEqual([]);
		await page.screenshot({ path: 'test-results/entry-attachments-phone.png', fullPage: true });
		await page.context().close();
	});

	it('an entry page without a plot loads only the page’s one script', async () => {
		const html = await (await fetch(`${base}/e/HL000001`)).text();
		const scripts = [...html.matchAll(/<script type="module" src="([^"]+)"/g)].map((m) => m[1]);
		expect(scripts).toHaveLength(1);
		expect(scripts[0]).toMatch(/entryPage-/);
	});
});

// Dropped files are checked in tests/integration/entryAttachments.test.ts (reviewAttachments).
describe('the curator’s review', () => {
	let dir: string;
	let server: RunningServer;
	let db: Kysely<Database>;

	beforeAll(async () => {
		dir = mkdtempSync(join(tmpdir(), 'hopline-review-attachments-'));
		const path = join(dir, 'r.sqlite');
		server = await startServer(path);
		db = openDatabase(path);
	}, 120_000);
	afterAll(async () => {
		await closeImagePool();
		await db?.destroy();
		await server?.stop();
		rmSync(dir, { recursive: true, force: true });
	});

	it('shows each version’s files, and which a change carries forward, adds and drops', async () => {
		// A contributor's proposed change to the demo spin record: its spectrum carried forward, a
		// new image added (written through the services into the server's own database and store).
		const store = diskStore(join(dirname(join(dir, 'r.sqlite')), 'attachments'));
		const user = await db
			.selectFrom('User')
			.select('id')
			.where('email', '=', 'contributor@demo.hopline.test')
			.executeTakeFirstOrThrow();
		const contributor = await loadSessionUser(db, user.id);
		if (!contributor) throw new Error('no demo contributor');
		const target = await db
			.selectFrom('entry_version as v')
			.innerJoin('entry as e', 'e.id', 'v.entry_id')
			.select(['v.id', 'v.entry_id', 'v.data', 'v.version'])
			.where('e.accession', '=', epr)
			.where('v.status', '=', 'approved')
			.executeTakeFirstOrThrow();
		const { id: submissionId } = await db
			.insertInto('submission')
			.values({
				channel: 'form',
				status: 'submitted',
				title: `Spin record ${epr}, new version`,
				submitted_by: contributor.id,
				row_count: 1,
				submitted_at: new Date().toISOString()
			})
			.returning('id')
			.executeTakeFirstOrThrow();
		const { id: versionId } = await db
			.insertInto('entry_version')
			.values({
				entry_id: target.entry_id,
				status: 'submitted',
				data: target.data,
				submission_id: submissionId,
				based_on_version: target.version,
				created_by: contributor.id,
				change_note: 'A better spectrum.'
			})
			.returning('id')
			.executeTakeFirstOrThrow();
		await carryForward(db, target.id, versionId);
		const added = await createAttachment(
			db,
			{
				store,
				limits: { maxBytes: 10_000_000, maxPixels: 40_000_000 },
				render: (bytes, photo) => renderImage(bytes, photo)
			},
			{
				entryId: target.entry_id,
				role: 'image',
				fileName: 'better.png',
				bytes: await pngOf(640, 400),
				meta: { kind: 'epr_spectrum', caption: 'A cleaner spectrum (test image)' },
				uploadedBy: contributor.id
			}
		);
		await listOnVersion(db, versionId, [added.id]);

		const page = await signedInPage(
			browser,
			server.baseUrl,
			'curator@demo.hopline.test',
			'demo-curator-pass',
			{ viewport: WIDE, bypassCSP: true }
		);
		await page.goto(`/review/${submissionId}`);
		const section = page.getByTestId('review-attachments');
		await expect.poll(() => section.getByTestId('attachment').count()).toBe(2);
		expect(await section.getByTestId('attachment-change').allTextContents()).toEqual([
			'carried forward',
			'added in this change'
		]);
		// The carried spectrum with its plot (hydrated here: the component's own buttons).
		expect(await section.getByTestId('attachment-plot').count()).toBe(1);
		await section.getByRole('button', { name: 'Reset zoom' }).waitFor();
		for (const img of await section.locator('img').all()) {
			await img.scrollIntoViewIfNeeded();
			await expect
				.poll(() => img.evaluate((i: HTMLImageElement) => i.naturalWidth))
				.toBeGreaterThan(0);
		}
		expect(await seriousViolations(page)).toEqual([]);
		await page.screenshot({ path: 'test-results/review-attachments.png', fullPage: true });
		await page.context().close();
	}, 60_000);
});
