import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';

// Every main page under the Content-Security-Policy, in Chromium: the page is served with the
// policy, SvelteKit's inline script runs (allowed by its hash), nothing is refused (scripts, styles, fonts,
// the CSV preview's module worker, SVG plots) and no script fails. The browser itself is the
// oracle: it reports each refusal as a `securitypolicyviolation` event and on the console.
const base = inject('baseUrl');
let browser: Browser;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());

/** Records what the browser refuses or fails at on this page, from before its first script. */
async function watch(page: Page): Promise<string[]> {
	const problems: string[] = [];
	await page.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => {
			const w = window as unknown as { __violations?: string[] };
			(w.__violations ??= []).push(`${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`);
		});
	});
	page.on('console', (m) => {
		if (/Content Security Policy|Refused to|Permissions-Policy/i.test(m.text()))
			problems.push(`console: ${m.text()}`);
	});
	page.on('pageerror', (e) => problems.push(`script error: ${e.message}`));
	page.on('requestfailed', (r) => {
		if (r.failure()?.errorText !== 'net::ERR_ABORTED')
			problems.push(`request failed: ${r.url()} ${r.failure()?.errorText}`);
	});
	return problems;
}

/** Pages sent as HTML without SvelteKit's client (`csr = false`): no inline script to allow. */
const WITHOUT_SCRIPTS = new Set(['/api', '/e/HL000013', '/e/HL000013/v1']);
/**
 * Of those, the documents with a script of their own, from our origin ('self' allows it): the
 * entry pages ($lib/enhance/entryPage.ts), whose script writes the reader's access date.
 */
const OWN_SCRIPT = new Set(['/e/HL000013', '/e/HL000013/v1']);

/** Opens a page and checks it: policy served, SvelteKit started, nothing refused. */
async function visit(page: Page, problems: string[], path: string, status = 200) {
	const response = await page.goto(path);
	expect(response?.status(), path).toBe(status);
	const csp = (await response?.headerValue('content-security-policy')) ?? '';
	const scripted = !WITHOUT_SCRIPTS.has(path);
	expect(csp, path).toMatch(scripted ? /script-src 'self' 'sha256-/ : /default-src 'self'/);
	expect(csp, path).toContain("frame-ancestors 'none'");
	await page.waitForLoadState('networkidle');
	const state = await page.evaluate(async () => {
		await document.fonts.ready;
		return {
			started: Object.keys(window).some((k) => k.startsWith('__sveltekit_')),
			violations: (window as unknown as { __violations?: string[] }).__violations ?? [],
			font: document.fonts.check('16px "Noto Sans"'),
			fontFaces: [...document.fonts].filter((f) => f.status === 'loaded').length
		};
	});
	expect(state.started, `${path}: SvelteKit's inline script ran (or none was sent)`).toBe(scripted);
	if (OWN_SCRIPT.has(path))
		await page.getByTestId('cite-accessed').filter({ hasText: 'Access date' }).waitFor();
	expect(state.violations, path).toEqual([]);
	expect(state.fontFaces, `${path}: Noto Sans loaded`).toBeGreaterThan(0);
	expect(problems, path).toEqual([]);
}

// Each page waits for the network to go quiet, and the machine is shared: a generous timeout.
const SLOW = 120_000;

describe('pages under the Content-Security-Policy, in Chromium', () => {
	it(
		'public pages and the 404 page',
		async () => {
			const page = await (await browser.newContext({ baseURL: base })).newPage();
			const problems = await watch(page);
			for (const path of [
				'/',
				'/search?kind=fe4s4',
				'/proteins',
				'/e/HL000013',
				'/e/HL000013/v1',
				'/calc',
				'/csv/columns',
				'/api',
				'/signin',
				'/signup',
				'/reset'
			])
				await visit(page, problems, path);
			await visit(page, problems, '/e/HL999999', 404);
		},
		SLOW
	);

	it(
		'calculators posting through use:enhance and drawing SVG plots; client-side navigation',
		async () => {
			const page = await (await browser.newContext({ baseURL: base })).newPage();
			const problems = await watch(page);
			await visit(page, problems, '/calc/tunnelling');
			await page.getByRole('button', { name: 'Calculate' }).click();
			await page.getByTestId('level-results').waitFor();
			expect(await page.locator('figure svg path').count()).toBeGreaterThan(0);
			await visit(page, problems, '/calc/hop-rate?distance=11&dG=-0.2&lambda=0.7');
			await page.getByRole('button', { name: 'Calculate' }).click();
			await page.getByTestId('hop-results').waitFor();

			// Client-side navigation (no full load) fetches the next page's data as JSON.
			await visit(page, problems, '/');
			await page.getByRole('link', { name: '[4Fe-4S]', exact: true }).click();
			await page.waitForURL(/\/search\?kind=fe4s4/);
			await page.locator('tbody tr').first().waitFor();
			const violations = await page.evaluate(
				() => (window as unknown as { __violations?: string[] }).__violations ?? []
			);
			expect(violations).toEqual([]);
			expect(problems).toEqual([]);
		},
		SLOW
	);

	it(
		"a contributor's pages, and the CSV preview in its module worker",
		async () => {
			const contributor = await signedInPage(
				browser,
				base,
				'contributor@demo.hopline.test',
				'demo-contributor-pass'
			);
			const problems = await watch(contributor);
			for (const path of [
				'/account',
				'/submissions',
				'/submissions/new/potential',
				'/submissions/upload'
			])
				await visit(contributor, problems, path);
			await contributor
				.locator('input[type=file]')
				.setInputFiles('tests/fixtures/csv/potentials-good.csv');
			await contributor.getByTestId('csv-preview').waitFor();
			expect(await contributor.getByTestId('csv-preview').textContent()).toMatch(/\d+ data rows/);
			expect(problems).toEqual([]);
		},
		SLOW
	);

	it(
		"curators' and admins' pages",
		async () => {
			const admin = await signedInPage(browser, base, 'admin@demo.hopline.test', 'demo-admin-pass');
			const problems = await watch(admin);
			for (const path of ['/review', '/audit', '/admin/users', '/admin/groups', '/admin/mail'])
				await visit(admin, problems, path);
		},
		SLOW
	);
});
