import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page as ApiPage, PotentialDto, ProteinDto } from '$lib/catalogue/dto';
import { seriousViolations } from '../support/axe';
import { launchChromium } from '../support/browser';

/*
 * Entry pages as a reader sees them (issue 14, §1, §6, §7), on the production build with the
 * demo scenario: the headline value first, charges typeset, the Unicode minus and one precision
 * per quantity; the "How to cite" strip with its format menu (copy with scripts, download
 * without) and the version dots; the energy ladder on a phone (its text rendered at 11 px or
 * more, the axis direction in words, entry and exit marked); a distance row's link to the
 * hop-rate calculator; the trade's words. Each page state is checked with axe-core and for
 * sideways scrolling at 390 px. Screenshots: test-results/entry-*.png.
 */
const base = inject('baseUrl');
let browser: Browser;
let converted: PotentialDto;
let revised: PotentialDto;
let rox: ProteinDto;

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1366, height: 900 };

beforeAll(async () => {
	browser = await launchChromium();
	const potentials = (await (
		await fetch(`${base}/api/v1/potentials?limit=500`)
	).json()) as ApiPage<PotentialDto>;
	const vsSce = potentials.items.find(
		(p) => p.reported.referenceElectrode === 'SCE' && p.emMvShe < 0 && p.couple.includes('2+')
	);
	const withHistory = potentials.items.find((p) => p.version >= 2 && p.source !== null);
	if (!vsSce || !withHistory) throw new Error('the demo has a converted and a revised potential');
	converted = vsSce;
	revised = withHistory;
	const proteins = (await (await fetch(`${base}/api/v1/proteins`)).json()) as ApiPage<ProteinDto>;
	const found = proteins.items.find((p) => p.name.startsWith('RoxA'));
	if (!found) throw new Error('the demo has the RoxA complex');
	rox = found;
}, 60_000);
afterAll(async () => browser?.close());

async function open(
	path: string,
	viewport = WIDE,
	options: { javaScriptEnabled?: boolean; clipboard?: boolean } = {}
): Promise<Page> {
	const context = await browser.newContext({
		baseURL: base,
		viewport,
		bypassCSP: true,
		javaScriptEnabled: options.javaScriptEnabled ?? true
	});
	if (options.clipboard)
		await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: base });
	const page = await context.newPage();
	await page.goto(path);
	return page;
}

const sidewaysOverflow = (page: Page) =>
	page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

/** Text as read: runs of white space (no-break spaces too) as one space. */
const plain = (text: string | null) => (text ?? '').replace(/\s+/g, ' ').trim();

describe('a potential’s page', () => {
	it('puts Em vs SHE first, with its uncertainty and conditions, marked as converted', async () => {
		const page = await open(`/e/${converted.accession}`);
		const headline = page.getByTestId('headline');
		// The headline comes right under the title, before the citing strip and the as-reported
		// fields of the frozen block.
		const order = await page.locator('main').evaluate((main) => {
			const at = (id: string) => main.querySelector(`[data-testid="${id}"]`);
			const [t, h, c, f] = ['entry-title', 'headline', 'cite-strip', 'frozen-fields'].map(at);
			if (!t || !h || !c || !f) return 0;
			const follows = (a: Element, b: Element) =>
				(a.compareDocumentPosition(b) & Node.DOCUMENT_POSITION_FOLLOWING) > 0;
			return follows(t, h) && follows(h, c) && follows(c, f) ? 1 : 0;
		});
		expect(order).toBe(1);
		// Oracle: the API's emMvShe, rounded to the mV, with U+2212 for its sign.
		const em = `−${Math.round(Math.abs(converted.emMvShe))} mV`;
		expect(plain(await page.getByTestId('headline-value').textContent())).toContain(em);
		if (converted.uncertaintyMv !== null)
			expect(plain(await page.getByTestId('headline-value').textContent())).toContain(
				`± ${Math.round(converted.uncertaintyMv)} mV`
			);
		expect(plain(await page.getByTestId('headline-converted').textContent())).toBe(
			'converted from SCE (saturated KCl)'
		);
		const conditions = plain(await page.getByTestId('headline-conditions').textContent());
		if (converted.ph !== null) expect(conditions).toMatch(/^pH \d+\.\d{1,2} ·/);
		if (converted.temperatureK !== null)
			expect(conditions).toContain(`${Number(converted.temperatureK.toFixed(2))} K`);
		// Charges typeset in the title and the couple; no ASCII minus before a number anywhere.
		const title = plain(await page.getByTestId('entry-title').textContent());
		expect(title).toContain('²⁺/¹⁺');
		expect(title).not.toContain('2+/1+');
		const block = plain(await page.getByTestId('frozen-version').textContent());
		expect(block).not.toMatch(/(^|[\s(])-\d/);
		expect(block).toContain('Em vs SHE (converted)');
		expect(block).not.toContain('normalised');
		expect(
			await headline.screenshot({ path: 'test-results/entry-headline-1366.png' })
		).toBeTruthy();
		expect(await seriousViolations(page)).toEqual([]);
		await page.context().close();
	});

	it('keeps the typed couple in its citation texts (display only)', async () => {
		const page = await open(`/e/${converted.accession}`);
		const record = plain(await page.getByTestId('cite-text-record').textContent());
		expect(record).toContain(converted.couple);
		await page.context().close();
	});
});

describe('the How to cite strip and the version dots', () => {
	it('shows both plain citations, copies each format, and marks the current version', async () => {
		const page = await open(`/e/${revised.accession}/v1`, WIDE, { clipboard: true });
		const strip = page.getByTestId('cite-strip');
		await strip.getByTestId('cite-accessed').filter({ hasText: 'Access date' }).waitFor();
		// The access date joins the citation once the reader's own calendar has been read.
		await strip.getByTestId('cite-text-record').filter({ hasText: '(accessed ' }).waitFor();
		const record = plain(await strip.getByTestId('cite-text-record').textContent());
		expect(record).toContain(`${base}/e/${revised.accession}/v1`);
		expect(record).toContain('version 1');
		const original = plain(await strip.getByTestId('cite-text-original').textContent());
		expect(original).toMatch(/https:\/\/doi\.org\/10\.5555\//);

		// The menu: closed at first, opens, copies RIS, closes; Escape closes it too.
		const menu = strip.getByRole('list', { name: 'Citation formats' });
		expect(await menu.isVisible()).toBe(false);
		await strip.getByTestId('cite-formats').click();
		expect(await menu.isVisible()).toBe(true);
		await page.screenshot({ path: 'test-results/entry-cite-menu-1366.png' });
		expect(await seriousViolations(page)).toEqual([]);
		await strip.getByRole('button', { name: 'Copy RIS' }).click();
		await strip.getByTestId('cite-status').filter({ hasText: 'RIS copied' }).waitFor();
		const ris = await page.evaluate(() => navigator.clipboard.readText());
		expect(ris).toMatch(/^TY {2}- DATA/);
		expect(ris).toContain(`UR  - ${base}/e/${revised.accession}/v1`);
		expect(await menu.isVisible()).toBe(false);
		await strip.getByTestId('cite-formats').click();
		await page.keyboard.press('Escape');
		expect(await menu.isVisible()).toBe(false);
		// The plain text of this version, by its own button.
		await strip.getByRole('button', { name: 'Copy citation of this version' }).click();
		await strip.getByTestId('cite-status').filter({ hasText: 'this version copied' }).waitFor();
		expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(record);

		// Version dots: one link per version, the current one marked for assistive technology.
		const dots = page.getByRole('navigation', { name: `Versions of ${revised.accession}` });
		const links = dots.getByRole('link', { name: /^v\d+, approved \d{4}-\d{2}-\d{2}/ });
		expect(await links.count()).toBe(revised.version);
		const current = dots.locator('a[aria-current="page"]');
		expect(await current.getAttribute('href')).toBe(`/e/${revised.accession}/v1`);
		expect(plain(await current.textContent())).toMatch(
			/^v1, approved \d{4}-\d{2}-\d{2} \(this page\)/
		);
		await links.last().click();
		await page.waitForURL(new RegExp(`/e/${revised.accession}/v${revised.version}$`));
		await expect(page.getByTestId('entry-version').textContent()).resolves.toBe(
			`version ${revised.version}`
		);
		await page.context().close();
	});

	it('without scripts shows the texts and downloads, and no copy buttons', async () => {
		const page = await open(`/e/${revised.accession}/v1`, PHONE, { javaScriptEnabled: false });
		const strip = page.getByTestId('cite-strip');
		expect(await strip.getByRole('button').count()).toBe(0);
		await strip.getByTestId('cite-formats').click();
		const href = await strip.getByTestId('cite-download-json').getAttribute('href');
		expect(href).toBe(`/e/${revised.accession}/v1/cite.json`);
		const file = await fetch(`${base}${href}`);
		expect(file.headers.get('content-type')).toContain('application/vnd.citationstyles.csl+json');
		await page.screenshot({ path: 'test-results/entry-cite-no-js-390.png', fullPage: true });
		expect(await sidewaysOverflow(page)).toBe(0);
		await page.context().close();
	});
});

describe('a protein’s page', () => {
	it('draws the energy ladder on a phone with text of 11 px or more, its direction and ends marked', async () => {
		const page = await open(`/e/${rox.accession}`, PHONE);
		const ladder = page.getByRole('img', { name: /^Energy ladder/ });
		await ladder.waitFor();
		// Rendered size of each label = its font size in viewBox units × the drawing's scale.
		const sizes = await ladder.evaluate((svg) => {
			const s = svg as SVGSVGElement;
			const scale = s.getBoundingClientRect().width / s.viewBox.baseVal.width;
			return [...s.querySelectorAll('text')].map((t) => ({
				text: t.textContent ?? '',
				px: parseFloat(getComputedStyle(t).fontSize) * scale
			}));
		});
		expect(sizes.length).toBeGreaterThan(10);
		for (const s of sizes) expect(s.px, s.text).toBeGreaterThanOrEqual(11);
		const svgWidth = await ladder.evaluate((svg) => svg.getBoundingClientRect().width);
		expect(svgWidth).toBeLessThanOrEqual(PHONE.width);
		expect(svgWidth).toBeGreaterThan(300);
		// The axis in words: more negative Em, higher up, is more reducing.
		const up = ladder.getByTestId('ladder-up');
		expect(await up.textContent()).toContain('↑ more reducing');
		const ticks = await ladder.evaluate((svg) =>
			[...svg.querySelectorAll('text[text-anchor="end"]')].map((t) => ({
				value: Number((t.textContent ?? '').replace('−', '-')),
				y: t.getBoundingClientRect().y
			}))
		);
		const top = ticks.reduce((a, b) => (a.y < b.y ? a : b));
		const bottom = ticks.reduce((a, b) => (a.y > b.y ? a : b));
		expect(top.value).toBeLessThan(bottom.value);
		// Entry and exit of the default chain (the flavin to the quinone site).
		expect(await ladder.getByTestId('ladder-entry').textContent()).toBe('e⁻ in');
		expect(await ladder.getByTestId('ladder-exit').textContent()).toBe('e⁻ out');
		expect(await ladder.getAttribute('aria-label')).toMatch(
			/electrons enter at FMN and leave at MK site/
		);
		await page
			.getByTestId('energy-ladder')
			.screenshot({ path: 'test-results/entry-ladder-390.png' });
		expect(await sidewaysOverflow(page)).toBe(0);
		expect(await seriousViolations(page)).toEqual([]);
		await page.context().close();
	});

	it('keeps the wide ladder’s text at 11 px or more from 640 px up', async () => {
		for (const width of [640, 1366]) {
			const page = await open(`/e/${rox.accession}`, { width, height: 900 });
			const ladder = page.getByRole('img', { name: /^Energy ladder/ });
			const smallest = await ladder.evaluate((svg) => {
				const s = svg as SVGSVGElement;
				const scale = s.getBoundingClientRect().width / s.viewBox.baseVal.width;
				return Math.min(
					...[...s.querySelectorAll('text')].map(
						(t) => parseFloat(getComputedStyle(t).fontSize) * scale
					)
				);
			});
			expect(smallest, `at ${width} px`).toBeGreaterThanOrEqual(11);
			await page.context().close();
		}
	});

	it('links each distance row to the hop-rate calculator for that pair', async () => {
		const page = await open(`/e/${rox.accession}`);
		const link = page.getByRole('link', { name: /^Hop rate for this pair/ }).first();
		const href = (await link.getAttribute('href')) ?? '';
		const url = new URL(href, base);
		expect(url.pathname).toBe('/calc/hop-rate');
		expect(url.searchParams.get('donor')).toMatch(/^HL\d{6}$/);
		expect(url.searchParams.get('acceptor')).toMatch(/^HL\d{6}$/);
		// The pair is the row's own: the two centres linked in its "Between" cell.
		const row = link.locator('xpath=ancestor::tr');
		const centres = await row
			.locator('td:nth-child(2) a')
			.evaluateAll((as) => as.map((a) => a.getAttribute('href')));
		expect(centres).toEqual([
			`/e/${url.searchParams.get('donor')}`,
			`/e/${url.searchParams.get('acceptor')}`
		]);
		await page.context().close();
	});

	it('uses the trade’s words and typesets redox states and couples in its tables', async () => {
		const page = await open(`/e/${rox.accession}`);
		const text = plain(await page.locator('main').textContent());
		expect(text).toContain('Cofactor type');
		expect(text).toContain('Redox state');
		expect(text).toContain('Degree of rate control');
		expect(text).toContain('Steady-state electron flux');
		expect(text).not.toMatch(/\bThroughput\b|\bSensitivity\b|Cofactor kind/);
		const potentials = plain(
			await page.locator('section[aria-labelledby="potentials-heading"]').textContent()
		);
		expect(potentials).toContain('[4Fe-4S]²⁺/¹⁺');
		expect(potentials).not.toContain('2+/1+');
		expect(potentials).not.toMatch(/(^|\s)-\d/);
		// Distances to 0.1 Å, always one decimal.
		const distances = await page
			.locator('section[aria-labelledby="distances-heading"] td.text-right')
			.allTextContents();
		expect(distances.length).toBeGreaterThan(0);
		for (const d of distances) expect(plain(d)).toMatch(/^(\d+\.\d Å|—)$/);
		await page.screenshot({ path: 'test-results/entry-protein-1366.png', fullPage: true });
		expect(await seriousViolations(page)).toEqual([]);
		await page.context().close();
	});
});

describe('at 390 px', () => {
	it.each(['/', '/e/HL000007/v1', '/e/HL000007/compare?from=1&to=2'])(
		'%s does not scroll sideways and has no serious axe violations',
		async (path) => {
			const page = await open(path, PHONE);
			expect(await sidewaysOverflow(page)).toBe(0);
			expect(await seriousViolations(page)).toEqual([]);
			await page.context().close();
		}
	);

	it('a potential’s page shows its headline value in the first screen and does not scroll sideways', async () => {
		const page = await open(`/e/${converted.accession}`, PHONE);
		expect(await sidewaysOverflow(page)).toBe(0);
		const box = await page.getByTestId('headline-value').boundingBox();
		expect(box && box.y + box.height).toBeLessThanOrEqual(PHONE.height);
		await page.screenshot({ path: 'test-results/entry-potential-390.png', fullPage: true });
		expect(await seriousViolations(page)).toEqual([]);
		await page.context().close();
	});
});
