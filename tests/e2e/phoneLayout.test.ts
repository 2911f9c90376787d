import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';

/*
 * The site on a phone (390 × 844 CSS px, a common handset viewport): no page scrolls sideways
 * (tables may scroll inside their own area), and the main menu folds behind a "Menu" control that
 * works with and without JavaScript. Screenshots: test-results/phone-*.png.
 */

const base = inject('baseUrl');
const PHONE = { width: 390, height: 844 };
let browser: Browser;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());

/** How far the page reaches beyond the viewport, in CSS px (0 when it does not scroll sideways). */
const sidewaysOverflow = (page: Page) =>
	page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

const mainMenu = (page: Page) => page.getByRole('navigation', { name: 'Main' });

describe('at 390 px', () => {
	it.each([
		'/',
		'/search',
		'/proteins',
		'/calc',
		'/calc/hop-rate',
		'/calc/titration',
		'/calc/tunnelling',
		'/api',
		'/signin',
		'/signup',
		'/e/HL000007',
		'/e/HL000056'
	])('%s does not scroll sideways', async (path) => {
		const page = await browser.newPage({ baseURL: base, viewport: PHONE });
		await page.goto(path);
		expect(await sidewaysOverflow(page)).toBe(0);
		await page.close();
	});

	it('folds the main menu behind a button that opens, closes on Escape, and closes on navigation', async () => {
		const page = await browser.newPage({ baseURL: base, viewport: PHONE });
		await page.goto('/');
		const button = page.getByRole('button', { name: 'Menu' });
		await button.waitFor();
		expect(await mainMenu(page).isVisible()).toBe(false);
		await button.click();
		expect(await button.getAttribute('aria-expanded')).toBe('true');
		await mainMenu(page).getByRole('link', { name: 'Calculators' }).waitFor();
		await page.screenshot({ path: 'test-results/phone-menu-open.png' });
		await page.keyboard.press('Escape');
		await mainMenu(page).waitFor({ state: 'hidden' });
		expect(await button.evaluate((b) => b === document.activeElement)).toBe(true);
		await button.click();
		await mainMenu(page).getByRole('link', { name: 'Proteins' }).click();
		await page.waitForURL('**/proteins');
		await mainMenu(page).waitFor({ state: 'hidden' });
		await page.close();
	});

	it('opens the menu as a link target without JavaScript', async () => {
		const context = await browser.newContext({
			baseURL: base,
			viewport: PHONE,
			javaScriptEnabled: false
		});
		const page = await context.newPage();
		await page.goto('/search');
		expect(await mainMenu(page).isVisible()).toBe(false);
		await page.getByRole('link', { name: 'Menu' }).click();
		await mainMenu(page).getByRole('link', { name: 'API' }).waitFor();
		expect(await sidewaysOverflow(page)).toBe(0);
		await context.close();
	});

	it('keeps a curator’s longer menu and name within the screen', async () => {
		const page = await signedInPage(
			browser,
			base,
			'curator@demo.hopline.test',
			'demo-curator-pass',
			{
				viewport: PHONE
			}
		);
		for (const path of ['/review', '/submissions', '/account']) {
			await page.goto(path);
			expect(await sidewaysOverflow(page), path).toBe(0);
		}
		await page.getByRole('button', { name: 'Menu' }).click();
		await mainMenu(page).getByRole('link', { name: 'Review' }).waitFor();
		await page.screenshot({ path: 'test-results/phone-curator-menu.png' });
		await page.context().close();
	});
});

describe('at 1366 px', () => {
	it('shows the main menu without a Menu control, and offers a skip link to the content', async () => {
		const page = await browser.newPage({ baseURL: base, viewport: { width: 1366, height: 900 } });
		await page.goto('/search');
		expect(await mainMenu(page).isVisible()).toBe(true);
		expect(await page.getByRole('button', { name: 'Menu' }).isVisible()).toBe(false);
		await page.keyboard.press('Tab');
		const skip = page.getByRole('link', { name: 'Skip to content' });
		expect(await skip.evaluate((a) => a === document.activeElement)).toBe(true);
		await skip.press('Enter');
		expect(await page.evaluate(() => document.activeElement?.id)).toBe('main');
		await page.close();
	});
});
