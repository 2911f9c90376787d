import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { PotentialDto, Page as ApiPage } from '$lib/catalogue/dto';
import { launchChromium } from '../support/browser';

const base = inject('baseUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());
beforeEach(async () => {
	await context?.close();
	context = await browser.newContext({ baseURL: base });
	await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: base });
	page = await context.newPage();
});

async function emColumn(): Promise<number[]> {
	const texts = await page.locator('tbody tr td:nth-child(5) span.font-medium').allTextContents();
	return texts.map((t) => Number(t.replace('−', '-').replace(/[^\d.-]/g, '')));
}

describe('catalogue in Chromium', () => {
	it('searches a cofactor kind from the home page', async () => {
		await page.goto('/');
		await page.getByRole('link', { name: '[4Fe-4S]', exact: true }).click();
		await page.waitForURL(/\/search\?kind=fe4s4/);
		// Columns: accession, protein, centre, couple, Em, cofactor type, … (organism hidden by default).
		const kinds = await page.locator('tbody tr td:nth-child(6)').allTextContents();
		expect(kinds.length).toBeGreaterThan(0);
		expect(new Set(kinds.map((k) => k.trim()))).toEqual(new Set(['[4Fe-4S]']));
		await page.screenshot({ path: 'test-results/search-kind.png', fullPage: true });
	});

	it('filters by Em range without reloading the page', async () => {
		// Typed once the page's script has started: hydration sets each field to the page's value.
		await page.goto('/search?kind=fe4s4', { waitUntil: 'networkidle' });
		await page.getByLabel('from').first().waitFor();
		await page.locator('input[name=emMin]').fill('-300');
		await page.locator('input[name=emMax]').fill('-200');
		// The page's script navigates: the new rows arrive as page data (read from the API on the
		// server), not as a new document.
		const dataCall = page.waitForRequest(
			(r) => r.url().includes('/search/__data.json') && r.url().includes('emMin=-300')
		);
		await page.getByRole('button', { name: 'Apply filters' }).click();
		await dataCall;
		await page.waitForURL(/emMin=-300/);
		const values = await emColumn();
		expect(values.length).toBeGreaterThan(0);
		for (const v of values) {
			expect(v).toBeGreaterThanOrEqual(-300);
			expect(v).toBeLessThanOrEqual(-200);
		}
		// Sorting by a column header keeps the filters and puts the order in the URL.
		await page.getByRole('button', { name: /Em vs SHE/ }).click();
		await page.waitForURL(/sort=em/);
		await page.waitForFunction(() => document.querySelector('th[aria-sort="ascending"]') !== null);
		const sorted = await emColumn();
		expect(sorted).toEqual([...sorted].sort((a, b) => a - b));
		expect(page.url()).toContain('emMax=-200');
	});

	it('hides a column and keeps that in a shareable URL', async () => {
		await page.goto('/search');
		// Organism and the value as reported are hidden by default; hiding Method as well is kept.
		await page.getByText('Columns', { exact: true }).click();
		const menu = page.locator('details', { hasText: 'Columns' });
		await menu.getByLabel('Method', { exact: true }).uncheck();
		await page.waitForURL(/hide=[^&]*method/);
		const shared = page.url();
		const other = await context.newPage();
		await other.goto(shared);
		await other.locator('tbody tr').first().waitFor();
		await expect(other.locator('thead th', { hasText: 'Method' }).count()).resolves.toBe(0);
		await expect(other.locator('thead th', { hasText: 'Organism' }).count()).resolves.toBe(0);
		await expect(other.locator('thead th', { hasText: 'Source' }).count()).resolves.toBe(1);
	});

	it('opens an entry, then an older version by permalink, and copies its BibTeX', async () => {
		const list = (await (
			await fetch(`${base}/api/v1/potentials?limit=500`)
		).json()) as ApiPage<PotentialDto>;
		const revised = list.items.find((p) => p.version >= 3);
		expect(revised, 'the demo has an entry with three versions').toBeDefined();
		const accession = revised?.accession ?? '';

		await page.goto(`/search?q=${accession}`);
		await page.getByRole('link', { name: accession, exact: true }).click();
		await page.waitForURL(new RegExp(`/e/${accession}$`));
		await expect(page.getByTestId('entry-version').textContent()).resolves.toBe(
			`version ${revised?.version}`
		);
		await expect(page.getByTestId('newer-version-notice').count()).resolves.toBe(0);

		await page.goto(`/e/${accession}/v1`);
		await expect(page.getByTestId('entry-version').textContent()).resolves.toBe('version 1');
		await expect(page.getByTestId('newer-version-notice').textContent()).resolves.toContain(
			`newer version exists: version ${revised?.version}`
		);
		await page.getByTestId('cite-formats').click();
		await page.getByRole('button', { name: 'Copy BibTeX' }).click();
		await page.getByTestId('cite-status').filter({ hasText: 'BibTeX copied' }).waitFor();
		const clipboard = await page.evaluate(() => navigator.clipboard.readText());
		expect(clipboard).toMatch(new RegExp(`^@misc\\{hopline_${accession}_v1,`));
		expect(clipboard).toContain(`url = {${base}/e/${accession}/v1}`);
		// The reader's local date, from the browser's own calendar (citations.test.ts tries zones).
		const local = await page.evaluate(() => new Date().toLocaleDateString('en-CA'));
		expect(clipboard).toContain(`urldate = {${local}}`);
		await page.screenshot({ path: 'test-results/old-version.png', fullPage: true });

		await page.getByRole('link', { name: 'what changed' }).click();
		await page.getByTestId('diff-table').waitFor();
		await expect(page.getByTestId('diff-table').textContent()).resolves.toContain(
			'Value as reported'
		);
	});

	it('shows a protein with its energy ladder and a chain-kinetics estimate stating its model', async () => {
		await page.goto('/proteins');
		await page
			.getByRole('link', { name: /RoxA–H/ })
			.first()
			.click();
		await page.getByRole('img', { name: /^Energy ladder/ }).waitFor();
		const chain = await page.getByTestId('chain-estimate').textContent();
		expect(chain).toMatch(/Steady-state electron flux .*\ss⁻¹/);
		expect(chain).toContain('mean first-passage time');
		expect(chain).toContain('Model estimate');
	});

	it('shows a 404 page with a search box for an unknown accession', async () => {
		const response = await page.goto('/e/HL999999');
		expect(response?.status()).toBe(404);
		await expect(page.getByRole('search').count()).resolves.toBe(1);
		const v = await page.goto('/e/HL000001/v77');
		expect(v?.status()).toBe(404);
	});

	it('explains malformed filters on the page', async () => {
		const response = await page.goto('/search?emMin=cold&phMax=99');
		expect(response?.status()).toBe(400);
		const text = await page.locator('main').textContent();
		expect(text).toContain('emMin');
		expect(text).toContain('phMax');
	});
});
