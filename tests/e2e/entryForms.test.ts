import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { launchChromium, submitSignIn } from '../support/browser';

// Issue 14 §3 in Chromium: entry forms keep what was typed (with and without JavaScript), read
// "−0,25", start required choices empty, suggest centres while typing (ARIA combobox, keyboard),
// show the curators' warnings before anything is sent (a Check step that works as a plain form
// action too), and Enter presses the primary action. Plus the upload page's words, axe and 390 px.

const base = inject('baseUrl');
let browser: Browser;
let withJs: BrowserContext;
let withoutJs: BrowserContext;
let page: Page;
let plain: Page;
/** A [4Fe-4S] centre of the demo: its 2+/1+ couple is typical from −750 to −50 mV vs SHE. */
let centre: { accession: string; label: string };

const field = (p: Page, name: string) => p.locator(`[name="${name}"]`);
const sidewaysOverflow = (p: Page) =>
	p.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

async function fillPotential(p: Page, values: Record<string, string>) {
	for (const [name, value] of Object.entries(values)) {
		const f = field(p, name);
		if ((await f.evaluate((el) => el.tagName)) === 'SELECT') await f.selectOption(value);
		else await f.fill(value);
	}
}

beforeAll(async () => {
	browser = await launchChromium();
	withJs = await browser.newContext({ baseURL: base, bypassCSP: true });
	page = await withJs.newPage();
	await submitSignIn(page, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	await page.getByTestId('user-menu').waitFor();
	withoutJs = await browser.newContext({
		baseURL: base,
		javaScriptEnabled: false,
		storageState: await withJs.storageState()
	});
	plain = await withoutJs.newPage();
	const list = (await (await fetch(`${base}/api/v1/centres?kind=fe4s4&limit=1`)).json()) as {
		items: { accession: string; label: string }[];
	};
	centre = list.items[0] as { accession: string; label: string };
});
afterAll(async () => browser?.close());

describe('entry forms with JavaScript', () => {
	it('start required choices empty and refuse them by name, keeping every value typed', async () => {
		await page.goto('/submissions/new/potential');
		for (const name of ['reportedUnit', 'referenceElectrode', 'method'])
			expect(await field(page, name).inputValue(), name).toBe('');
		expect(await field(page, 'reportedUnit').locator('option').first().textContent()).toBe(
			'choose…'
		);
		await page
			.getByTestId('entry-form')
			.evaluate((f) => ((f as HTMLFormElement).noValidate = true));
		await fillPotential(page, {
			centreAccession: centre.accession,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: ' \u22120,25 ',
			ph: '7,5',
			buffer: 'Tris 20 mM'
		});
		await page.getByRole('button', { name: 'Submit for review' }).click();
		await page.locator('[data-field-error=reportedUnit]').waitFor();
		expect(await page.locator('[data-field-error=reportedUnit]').textContent()).toBe(
			'choose the unit as reported'
		);
		expect(await page.locator('[data-field-error=method]').textContent()).toBe('choose the method');
		// The number with a Unicode minus and a decimal comma was read: no error beside it.
		expect(await page.locator('[data-field-error=reportedValue]').count()).toBe(0);
		expect(await page.locator('[data-field-error=ph]').count()).toBe(0);
		expect(await field(page, 'reportedValue').inputValue()).toBe(' \u22120,25 ');
		expect(await field(page, 'centreAccession').inputValue()).toBe(centre.accession);
		expect(await field(page, 'buffer').inputValue()).toBe('Tris 20 mM');
		expect(page.url()).toMatch(/\/submissions\/new\/potential$/);
	});

	it('suggest centres while typing: arrows, Enter and Escape, as an ARIA combobox', async () => {
		await page.goto('/submissions/new/potential');
		// The combobox roles arrive with the script (without it the field is a plain text input).
		await page.locator('[name=centreAccession][role=combobox]').waitFor();
		const input = field(page, 'centreAccession');
		expect(await input.getAttribute('role')).toBe('combobox');
		expect(await input.getAttribute('aria-expanded')).toBe('false');
		await input.pressSequentially('cluster', { delay: 20 });
		const list = page.getByRole('listbox', { name: 'Suggestions' });
		await list.waitFor();
		expect(await input.getAttribute('aria-expanded')).toBe('true');
		const options = list.getByRole('option');
		expect(await options.count()).toBeGreaterThan(1);
		const second = (await options.nth(1).locator('.font-mono').textContent()) ?? '';
		expect(second).toMatch(/^HL\d{6}$/);
		expect(await seriousViolations(page)).toEqual([]);
		await input.press('ArrowDown');
		await input.press('ArrowDown');
		expect(await input.getAttribute('aria-activedescendant')).toBe(
			await options.nth(1).getAttribute('id')
		);
		expect(await options.nth(1).getAttribute('aria-selected')).toBe('true');
		await input.press('Enter');
		expect(await input.inputValue()).toBe(second);
		expect(await list.isHidden()).toBe(true);
		// Enter chose a suggestion; it did not send the form.
		expect(page.url()).toMatch(/\/submissions\/new\/potential$/);
		await page.getByTestId('reference-named').waitFor();
		// Escape closes the list and leaves the text as typed.
		await input.fill('');
		await input.pressSequentially('clu', { delay: 20 });
		await list.waitFor();
		await input.press('Escape');
		expect(await list.isHidden()).toBe(true);
		expect(await input.inputValue()).toBe('clu');
		// An accession typed directly is taken as it is, and named.
		await input.fill(centre.accession);
		await page.getByTestId('reference-named').waitFor();
		expect(await page.getByTestId('reference-named').textContent()).toContain(centre.label);
	});

	it('show the warnings the curators will see before sending, and Enter presses Submit for review', async () => {
		await page.goto('/submissions/new/potential');
		await fillPotential(page, {
			centreAccession: centre.accession,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: '0,9',
			reportedUnit: 'V',
			referenceElectrode: 'SHE',
			method: 'epr_titration',
			ph: '7,0',
			changeNote: 'entry form test'
		});
		await page.getByRole('button', { name: 'Check', exact: true }).click();
		await page.getByTestId('form-check').waitFor();
		const warning = page.locator('[data-testid=form-check] [data-warning=range]');
		// +900 mV vs SHE is above −750 to −50 mV (typicalRanges.ts, from Liu et al. 2014).
		expect(await warning.textContent()).toContain('above the typical range');
		expect(await warning.textContent()).toContain('bounds approximate');
		expect(await field(page, 'reportedValue').inputValue()).toBe('0,9');
		expect(await field(page, 'reportedUnit').inputValue()).toBe('V');
		expect(await seriousViolations(page)).toEqual([]);
		await page.screenshot({ path: 'test-results/entry-form-check.png', fullPage: true });
		// Enter in a text field: the primary action (Submit for review), never Save draft.
		await field(page, 'ph').press('Enter');
		await page.waitForURL(/\/submissions\/\d+\?submitted$/);
		expect(await page.locator('[data-warning=range]').count()).toBe(1);
	});

	it('do not send unseen warnings: Submit shows them first', async () => {
		await page.goto('/submissions/new/potential');
		await fillPotential(page, {
			centreAccession: centre.accession,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: '+850',
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			method: 'epr_titration'
		});
		await page.getByRole('button', { name: 'Submit for review' }).click();
		await page.getByTestId('unseen-warnings').waitFor();
		expect(page.url()).toMatch(/\/submissions\/new\/potential$/);
		expect(await field(page, 'reportedValue').inputValue()).toBe('+850');
		await page.getByRole('button', { name: 'Submit for review' }).click();
		await page.waitForURL(/\/submissions\/\d+\?submitted$/);
	});

	it('send the source form with Enter, not "Fill from DOI"', async () => {
		await page.goto('/submissions/new/source');
		expect(await field(page, 'sourceKind').inputValue()).toBe('');
		await field(page, 'sourceKind').selectOption('dataset');
		await field(page, 'authors').fill('Doe, Jane');
		await field(page, 'title').fill('Titrations of a test protein');
		await field(page, 'title').press('Enter');
		await page.waitForURL(/\/submissions\/\d+\?submitted$/);
	});
});

describe('entry forms without JavaScript', () => {
	it('keep what was typed after a refusal, and the reference field is a plain text input', async () => {
		await plain.goto('/submissions/new/potential');
		expect(await field(plain, 'centreAccession').getAttribute('role')).toBeNull();
		await field(plain, 'centreAccession').fill(centre.accession);
		await field(plain, 'couple').fill('[4Fe-4S]2+/1+');
		await field(plain, 'reportedValue').fill('−0,3x');
		await field(plain, 'buffer').fill('HEPES');
		await plain
			.getByTestId('entry-form')
			.evaluate((f) => ((f as HTMLFormElement).noValidate = true));
		await plain.getByRole('button', { name: 'Submit for review' }).click();
		await plain.locator('[data-field-error=reportedValue]').waitFor();
		expect(await field(plain, 'reportedValue').inputValue()).toBe('−0,3x');
		expect(await field(plain, 'centreAccession').inputValue()).toBe(centre.accession);
		expect(await field(plain, 'couple').inputValue()).toBe('[4Fe-4S]2+/1+');
		expect(await field(plain, 'buffer').inputValue()).toBe('HEPES');
		expect(await plain.locator('[data-field-error=reportedUnit]').textContent()).toBe(
			'choose the unit as reported'
		);
	});

	it('run the check step as a plain form action, then submit', async () => {
		await plain.goto('/submissions/new/potential');
		await fillPotential(plain, {
			centreAccession: centre.accession,
			couple: '[4Fe-4S]2+/1+',
			reportedValue: '\u2212900',
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			method: 'protein_film_voltammetry',
			temperatureK: '25 °C'
		});
		await plain.getByRole('button', { name: 'Check', exact: true }).click();
		await plain.getByTestId('form-check').waitFor();
		// −900 mV vs SHE is below −750 mV (typicalRanges.ts).
		expect(await plain.locator('[data-warning=range]').textContent()).toContain('below');
		expect(await field(plain, 'reportedValue').inputValue()).toBe('\u2212900');
		expect(await field(plain, 'method').inputValue()).toBe('protein_film_voltammetry');
		expect(await field(plain, 'temperatureK').inputValue()).toBe('25 °C');
		await plain.getByRole('button', { name: 'Submit for review' }).click();
		await plain.waitForURL(/\/submissions\/\d+\?submitted$/);
	});
});

describe('the upload page', () => {
	it('says "Check only" and "Submit for review", never "dry run"', async () => {
		await page.goto('/submissions/upload');
		await page.getByRole('button', { name: 'Check only' }).waitFor();
		await page.getByRole('button', { name: 'Submit for review' }).waitFor();
		expect((await page.locator('main').textContent())?.toLowerCase()).not.toContain('dry run');
		expect(await seriousViolations(page)).toEqual([]);
	});
});

describe('at 390 px', () => {
	it('no form page scrolls sideways, the check step and open suggestions included', async () => {
		const phone = await browser.newContext({
			baseURL: base,
			bypassCSP: true,
			viewport: { width: 390, height: 844 },
			storageState: await withJs.storageState()
		});
		const p = await phone.newPage();
		for (const path of [
			'/submissions/new/potential',
			'/submissions/new/source',
			'/submissions/new/distance',
			'/submissions/upload'
		]) {
			await p.goto(path);
			expect(await sidewaysOverflow(p), path).toBe(0);
		}
		await p.goto('/submissions/new/potential');
		await field(p, 'centreAccession').pressSequentially('cluster', { delay: 20 });
		await p.getByRole('listbox', { name: 'Suggestions' }).waitFor();
		expect(await sidewaysOverflow(p)).toBe(0);
		expect(await seriousViolations(p)).toEqual([]);
		await p.screenshot({ path: 'test-results/entry-form-suggestions-390.png', fullPage: true });
		await phone.close();
	});
});
