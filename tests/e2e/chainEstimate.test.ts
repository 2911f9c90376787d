import { copyFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CentreDto, Page as ApiPage, ProteinDto } from '$lib/catalogue/dto';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import { launchChromium } from '../support/browser';
import { buildHiddenFixtures, HIDDEN_MARKS, type HiddenFixtures } from '../support/hiddenFixtures';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/*
 * The chain estimate of a protein page, on the production build with the demo scenario plus a
 * centre only the demo consortium may see: the default chain of the respiratory complex runs from
 * its flavin to its quinone, the reader picks other ends and conditions with a plain GET form
 * (no scripts needed), each hop shows the conditions of its two potentials and the two-electron
 * stand-ins, chosen pages are kept like any other, and a hidden centre named in the query is
 * answered exactly as one that does not exist. Screenshots: test-results/chain-estimate-*.png.
 */

let server: RunningServer;
let dir: string;
let fx: HiddenFixtures;
let base: string;
let browser: Browser;
let rox: string;
const centres: Record<string, string> = {};

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-chain-'));
	const path = join(dir, 'chain.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	fx = await buildHiddenFixtures(db);
	await db.destroy();
	server = await startServer(path);
	base = server.baseUrl;
	browser = await launchChromium();
	const proteins = (await (
		await fetch(`${base}/api/v1/proteins?limit=50`)
	).json()) as ApiPage<ProteinDto>;
	rox = proteins.items.find((p) => p.name.startsWith('RoxA–H'))!.accession;
	const list = (await (
		await fetch(`${base}/api/v1/centres?protein=${rox}&limit=50`)
	).json()) as ApiPage<CentreDto>;
	for (const c of list.items) centres[c.label] = c.accession;
}, 120_000);

afterAll(async () => {
	await browser?.close();
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

const SHOTS = '/tmp/h-chain';
async function shoot(page: Page, name: string) {
	const path = `test-results/${name}.png`;
	await page.getByTestId('chain-estimate').screenshot({ path });
	mkdirSync(SHOTS, { recursive: true });
	copyFileSync(path, join(SHOTS, `${name}.png`));
}

/** Text as read, its runs of white space (no-break spaces between numbers and units too) as one space. */
const plain = (text: string | null) => (text ?? '').replace(/\s+/g, ' ');

async function pageAt(width: number, javaScriptEnabled = true): Promise<Page> {
	const context = await browser.newContext({
		baseURL: base,
		viewport: { width, height: 900 },
		javaScriptEnabled
	});
	return context.newPage();
}

describe('chain estimate on a protein page', () => {
	it('runs by default from the flavin to the quinone, showing each hop’s conditions and stand-ins', async () => {
		for (const width of [1366, 390]) {
			const page = await pageAt(width);
			await page.goto(`/e/${rox}`);
			const section = page.getByTestId('chain-estimate');
			await expect(section.locator('h3').textContent()).resolves.toMatch(
				/Electron transit from FMN to MK site/
			);
			// Wide screens show a table of hops, narrow ones a block per hop.
			const hop = page.getByTestId(width < 640 ? 'chain-hop-card' : 'chain-hop').first();
			expect(await hop.isVisible()).toBe(true);
			const firstHop = plain(await hop.textContent());
			expect(firstHop).toMatch(/FMN \(entry\): ox\/hq −340 mV at pH 7\.0, 298\.15 K/);
			expect(firstHop).toContain('— two-electron couple used as an approximation');
			if (width < 640) expect(firstHop).toMatch(/Forward \d\.\d\d × 10[⁰¹²³⁴⁵⁶⁷⁸⁹]+ s⁻¹/);
			expect(plain(await page.getByTestId('chain-warnings').textContent())).toContain(
				'MK site: two-electron couple used as an approximation (Q/QH2; the one-electron Q/SQ couple is not recorded)'
			);
			const text = plain(await section.textContent());
			expect(text).toMatch(/Steady-state electron flux .* s⁻¹/);
			expect(text).toContain('No sample was blocked');
			expect(text).toContain('both directions of the hop scaled together');
			expect(text).toContain('no pH correction is applied');
			// The side cluster C1 hangs on the entry: a hop the electron may take, not the start.
			expect(text).toContain('FMN → C1');
			// At 390 px the warnings wrap inside the page: nothing wider than the screen but the table.
			const overflow = await page
				.getByTestId('chain-warnings')
				.evaluate((el) => el.scrollWidth - el.clientWidth);
			expect(overflow).toBeLessThanOrEqual(0);
			await shoot(page, `chain-estimate-${width}`);
			await page.context().close();
		}
	});

	it('lets the reader choose entry, exit and conditions without JavaScript (GET)', async () => {
		const page = await pageAt(390, false);
		await page.goto(`/e/${rox}`);
		const form = page.getByTestId('chain-choice');
		await form.getByLabel('Entry (electrons in)').selectOption({ label: 'C1' });
		await form.getByLabel('Exit (electrons out)').selectOption({ label: 'C5' });
		await form.getByLabel('pH').fill('8');
		await form.getByRole('button', { name: 'Estimate' }).click();
		await page.waitForURL(/entry=HL\d+&exit=HL\d+&ph=8&temperature=298.15/);
		expect(new URL(page.url()).searchParams.get('entry')).toBe(centres.C1);
		const section = page.getByTestId('chain-estimate');
		await expect(section.locator('h3').textContent()).resolves.toMatch(/from C1 to C5/);
		const text = plain(await section.textContent());
		// C3's values: pH 7 and pH 8.5; the one nearest pH 8 is used, and said to be.
		expect(text).toMatch(/C3: \[4Fe-4S\]²⁺\/¹⁺ −\d+ mV at pH 8\.5, 298\.15 K/);
		expect(text).toContain('at pH 8.0 and 298.15 K');
		expect(text).not.toContain('MK site (exit)');
		// The flavin relays here: it takes an electron into its oxidised level.
		expect(text).toContain(
			'FMN: two-electron couple used as an approximation (ox/hq; the one-electron ox/sq couple is not recorded)'
		);
		await shoot(page, 'chain-estimate-chosen-390-no-js');
		await page.context().close();
	});

	it('keeps a chosen page for signed-out readers as any other page (ETag, 304)', async () => {
		const path = `/e/${rox}?entry=${centres.C2}&exit=${centres.C7}&ph=7&temperature=300`;
		const first = await fetch(`${base}${path}`);
		expect(first.status).toBe(200);
		expect(first.headers.get('cache-control')).toBe('public, no-cache');
		const etag = first.headers.get('etag')!;
		const body = await first.text();
		expect(body).toContain('from C2 to C7');
		const again = await fetch(`${base}${path}`);
		expect(again.headers.get('etag')).toBe(etag);
		expect(await again.text()).toBe(body);
		const revalidated = await fetch(`${base}${path}`, { headers: { 'if-none-match': etag } });
		expect(revalidated.status).toBe(304);
	});

	it('answers a bad choice with a 400 naming the parameter, never kept', async () => {
		const cases: [string, string][] = [
			['ph=0x10', 'ph: expected a plain decimal number'],
			['temperature=20', 'temperature: expected a number from 273.15 K to 373.15 K'],
			[`entry=${centres.C2}&exit=${centres.C2}`, 'exit: entry and exit must be different centres'],
			['entry=HL99', 'entry: expected an accession'],
			[
				`exit=${fx.hiddenPotential}`,
				`exit: no centre ${fx.hiddenPotential} among the centres of this protein`
			]
		];
		for (const [query, message] of cases) {
			for (let i = 0; i < 2; i++) {
				const res = await fetch(`${base}/e/${rox}?${query}`);
				expect(res.status).toBe(400);
				expect(await res.text()).toContain(message);
			}
		}
	});

	it('answers a hidden centre exactly as one that does not exist; a member is told the truth', async () => {
		const outsider = await fetch(`${base}/e/${fx.publicProtein}?entry=${fx.hiddenCentre}`);
		const nowhere = await fetch(`${base}/e/${fx.publicProtein}?entry=HL999998`);
		expect(outsider.status).toBe(400);
		expect(nowhere.status).toBe(400);
		const said = await outsider.text();
		expect(said).toContain(
			`entry: no centre ${fx.hiddenCentre} among the centres of this protein (or not visible to you)`
		);
		expect(said.replaceAll(fx.hiddenCentre, 'ASKED')).toBe(
			(await nowhere.text()).replaceAll('HL999998', 'ASKED')
		);
		expect(said).not.toContain(HIDDEN_MARKS.centreLabel);
		const member = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
		const told = await fetch(`${base}/e/${fx.publicProtein}?entry=${fx.hiddenCentre}`, {
			headers: { cookie: member }
		});
		expect(await told.text()).toContain(
			`centre ${HIDDEN_MARKS.centreLabel} (${fx.hiddenCentre}) has no potential you can see`
		);
	});
});
