import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { launchChromium } from '../support/browser';
import { startServer, type RunningServer } from '../support/server';

/*
 * The search page at a glance: the trade's spellings through the page, a dense table at
 * 1366 px with every main column in view, cards and a filters drawer on a phone (with and
 * without JavaScript), focus on the results after a search, facet counts within the search, and
 * axe (0 critical, 0 serious) on each state.
 */

// A server of its own with the demo scenario untouched: the expected counts are the demo's, and
// other test files add potentials to the shared server.
let server: RunningServer;
let dir: string;
let base: string;
const DESK = { width: 1366, height: 900 };
const PHONE = { width: 390, height: 844 };
let browser: Browser;

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-search-page-'));
	server = await startServer(join(dir, 'search.sqlite'));
	base = server.baseUrl;
	browser = await launchChromium();
}, 120_000);
afterAll(async () => {
	await browser?.close();
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

async function open(path: string, viewport = DESK, javaScriptEnabled = true): Promise<Page> {
	const context = await browser.newContext({
		baseURL: base,
		viewport,
		bypassCSP: true,
		javaScriptEnabled
	});
	const page = await context.newPage();
	await page.goto(path);
	return page;
}

const count = async (page: Page) =>
	Number((await page.getByTestId('result-count').textContent())?.split(' of ')[1]);

describe('search vocabulary through the page', () => {
	it.each([
		['4Fe4S', 20],
		['[4Fe-4S]2+/1+', 20],
		['heme c', 8],
		['EPR', 21]
	])('"%s" finds %i potentials', async (q, expected) => {
		// Expected counts: the demo scenario (seed/demo.ts) — twenty [4Fe-4S]2+/1+ potentials of
		// [4Fe-4S] centres, eight of the four c hemes, twenty-one EPR-monitored titrations.
		const page = await open(`/search?q=${encodeURIComponent(q)}`);
		expect(await count(page)).toBe(expected);
		await page.context().close();
	});
});

describe('a new search', () => {
	it.each([true, false])(
		'keeps the chosen filters and sort (JavaScript %s)',
		async (javaScriptEnabled) => {
			const page = await open('/search?kind=fe4s4&sort=em&order=asc', DESK, javaScriptEnabled);
			await page.getByRole('searchbox', { name: 'Search the registry' }).fill('ferredoxin');
			await page.getByRole('button', { name: 'Search', exact: true }).click();
			await page.waitForURL(/q=ferredoxin/);
			const params = new URL(page.url()).searchParams;
			expect(params.get('kind')).toBe('fe4s4');
			expect(params.get('sort')).toBe('em');
			expect(params.get('order')).toBe('asc');
		}
	);
});

describe('at 1366 px', () => {
	it('shows one line a row with pH, T, method and source in view, the header sticky', async () => {
		const page = await open('/search');
		for (const name of ['pH', 'T (K)', 'Method', 'Source', 'Em vs SHE (converted)']) {
			const header = page.getByRole('columnheader', { name });
			const box = await header.boundingBox();
			expect(box, name).not.toBeNull();
			expect(box!.x + box!.width, name).toBeLessThanOrEqual(DESK.width);
		}
		const heights = await page
			.getByTestId('result-row')
			.evaluateAll((rows) => rows.map((r) => r.getBoundingClientRect().height));
		expect(heights.length).toBe(25);
		for (const h of heights) expect(h).toBeLessThan(40);
		expect(await page.getByText('DEMO DATA', { exact: true }).count()).toBe(0);
		const sticky = await page
			.getByRole('columnheader', { name: 'pH' })
			.evaluate((th) => getComputedStyle(th).position);
		expect(sticky).toBe('sticky');
		expect(await seriousViolations(page)).toEqual([]);
		await page.screenshot({ path: 'test-results/search-desk.png' });
		await page.context().close();
	});

	it('moves focus to the results after a filter, and counts facets within the search', async () => {
		const page = await open('/search?q=4Fe4S');
		// Within the search: the only cofactor type is [4Fe-4S]; methods count its potentials.
		const kinds = page.getByRole('group', { name: 'Cofactor type' });
		expect(await kinds.getByRole('checkbox').count()).toBe(1);
		await page
			.getByRole('group', { name: 'Method' })
			.getByLabel(/EPR-monitored/)
			.check();
		await page.getByRole('button', { name: 'Apply filters' }).click();
		await page.waitForURL(/method=epr_titration/);
		await expect
			.poll(() => page.evaluate(() => document.activeElement?.id))
			.toBe('results-heading');
		expect(await page.getByTestId('results-announcement').textContent()).toMatch(
			/\d+ potentials? match/
		);
		await page.context().close();
	});

	it('keeps a chosen choice with no match visible, dimmed', async () => {
		const page = await open('/search?q=heme%20c&kind=fe4s4&kind=heme_c');
		const chosen = page.locator('label[data-zero]');
		expect(await chosen.count()).toBe(1);
		expect(await chosen.textContent()).toContain('[4Fe-4S]');
		expect(await seriousViolations(page)).toEqual([]);
		await page.context().close();
	});
});

describe('at 390 px', () => {
	it('lists cards and opens the filters in a drawer that Escape closes', async () => {
		const page = await open('/search', PHONE);
		expect(await page.evaluate(() => document.documentElement.scrollWidth - innerWidth)).toBe(0);
		expect(await page.getByTestId('result-cards').getByRole('listitem').count()).toBe(25);
		const opener = page.getByTestId('filters-open');
		const form = page.getByRole('form', { name: 'Filters' });
		expect(await form.isVisible()).toBe(false);
		await opener.click();
		await form.waitFor();
		expect(await opener.getAttribute('aria-expanded')).toBe('true');
		expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Filters');
		expect(await seriousViolations(page)).toEqual([]);
		await page.screenshot({ path: 'test-results/search-phone-drawer.png' });
		await page.keyboard.press('Escape');
		await form.waitFor({ state: 'hidden' });
		expect(await opener.evaluate((a) => a === document.activeElement)).toBe(true);
		await page.context().close();
	});

	it('opens the drawer without JavaScript too', async () => {
		const page = await open('/search', PHONE, false);
		const form = page.getByRole('form', { name: 'Filters' });
		expect(await form.isVisible()).toBe(false);
		await page.getByTestId('filters-open').click();
		await form.waitFor();
		await page.getByRole('link', { name: 'Close' }).click();
		await form.waitFor({ state: 'hidden' });
		await page.context().close();
	});
});
