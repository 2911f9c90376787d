import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { launchChromium, submitSignIn } from '../support/browser';

/*
 * axe-core (Deque's accessibility engine, rules for WCAG 2.x A and AA) run in Chromium on the
 * page states readers, contributors, curators and admins reach: no critical and no serious
 * violation. The engine is injected into each page; the test's browser context bypasses the
 * site's Content Security Policy for that one script (the site itself runs no inline script).
 */

const base = inject('baseUrl');
let browser: Browser;

const READER_PAGES = [
	'/',
	'/search',
	'/search?kind=fe4s4&phMin=6&phMax=9',
	'/proteins',
	'/calc',
	'/calc/hop-rate',
	'/calc/hop-rate?distance=10&dG=-0.1&lambda=0.7',
	'/calc/titration',
	'/calc/tunnelling',
	'/api',
	'/signin',
	'/signup',
	'/e/HL000007',
	'/e/HL000056',
	'/e/HL000007/v1',
	'/no-such-page'
];

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());

describe.each([
	['1366 px', { width: 1366, height: 900 }],
	['390 px', { width: 390, height: 844 }]
])('a reader at %s', (_, viewport) => {
	it('meets axe-core with no critical or serious violation on every page', async () => {
		const context = await browser.newContext({ baseURL: base, viewport, bypassCSP: true });
		const page = await context.newPage();
		const found: string[] = [];
		for (const path of READER_PAGES) {
			await page.goto(path);
			for (const v of await seriousViolations(page)) found.push(`${path}: ${v}`);
		}
		await context.close();
		expect(found).toEqual([]);
	});
});

describe.each([
	['admin@demo.hopline.test', 'demo-admin-pass', ['/admin', '/audit', '/review', '/account']],
	[
		'contributor@demo.hopline.test',
		'demo-contributor-pass',
		[
			'/submissions',
			'/submissions/new/potential',
			'/submissions/new/protein',
			'/submissions/upload',
			'/account'
		]
	]
])('signed in as %s', (email, password, paths) => {
	it('meets axe-core with no critical or serious violation on every page', async () => {
		const context = await browser.newContext({ baseURL: base, bypassCSP: true });
		const page = await context.newPage();
		await submitSignIn(page, email, password);
		await page.getByTestId('user-menu').waitFor();
		const found: string[] = [];
		for (const path of paths) {
			const answer = await page.goto(path);
			expect(answer?.status(), path).toBe(200);
			for (const v of await seriousViolations(page)) found.push(`${path}: ${v}`);
		}
		await context.close();
		expect(found).toEqual([]);
	});
});
