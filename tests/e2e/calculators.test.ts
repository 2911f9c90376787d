import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium } from '../support/browser';

const base = inject('baseUrl');
let browser: Browser;
let page: Page;
beforeAll(async () => {
	browser = await launchChromium();
	page = await (await browser.newContext({ baseURL: base })).newPage();
});
afterAll(async () => browser?.close());

describe('calculators in Chromium', () => {
	it('hop rate: fills the form and shows both models with a caution', async () => {
		await page.goto('/calc/hop-rate');
		await page.getByLabel('Edge-to-edge distance (Å)').fill('11');
		await page.getByLabel('ΔG° of the hop (eV, negative downhill)').fill('-0.2');
		await page.getByLabel('Reorganization energy λ (eV)').fill('0.7');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('hop-results').waitFor();
		const text = await page.getByTestId('hop-results').textContent();
		expect(text).toContain('Moser–Dutton');
		expect(text).toContain('Marcus');
		expect(await page.locator('aside[role=note]').textContent()).toContain('Model estimate');
		expect(page.url()).toContain('distance=11');
	});
	it('hop rate: a bad value is named beside its field', async () => {
		await page.goto('/calc/hop-rate?distance=-3&dG=0&lambda=0.7');
		expect(await page.locator('[data-field-error=distance]').textContent()).toMatch(
			/3\.6 Å to 100 Å \(.*van der Waals contact/
		);
		await page.goto('/calc/hop-rate?distance=0x10&dG=0&lambda=0.7');
		expect(await page.locator('[data-field-error=distance]').textContent()).toMatch(
			/plain decimal number/
		);
	});
	// The values typed (a typeset minus, decimal commas) are read, and stay in the form as typed
	// after the run, whether the browser runs the page's JavaScript or not.
	for (const javaScriptEnabled of [true, false]) {
		it(`hop rate: typed values are read and kept (JavaScript ${javaScriptEnabled ? 'on' : 'off'})`, async () => {
			const context = await browser.newContext({ baseURL: base, javaScriptEnabled });
			const p = await context.newPage();
			await p.goto('/calc/hop-rate');
			const typed: [string, string, string][] = [
				['distance', 'Edge-to-edge distance (Å)', '11,5'],
				['dG', 'ΔG° of the hop (eV, negative downhill)', '\u22120,2'],
				['lambda', 'Reorganization energy λ (eV)', '0,7'],
				['temperature', 'Temperature (K)', '310,5'],
				['packing', 'Packing density ρ (0–1)', '0,7']
			];
			for (const [, label, value] of typed) await p.getByLabel(label).fill(value);
			await p.getByRole('button', { name: 'Calculate' }).click();
			await p.getByTestId('hop-results').waitFor();
			for (const [name, , value] of typed)
				expect(await p.locator(`input[name=${name}]`).inputValue(), name).toBe(value);
			expect(await p.getByTestId('detailed-balance').textContent()).toMatch(
				/at 310\.5 K: 3\.25 decades/
			);
			expect(await p.getByTestId('rate-validity').textContent()).toMatch(/order of magnitude/);
			await context.close();
		});
	}
	it('titration: pasted points give Em with its standard error and plots', async () => {
		await page.goto('/calc/titration');
		const rows = ['potential_mv;signal'];
		for (let e = -500; e <= 0; e += 20)
			rows.push(`${e};${(1 / (1 + Math.exp((e + 300) / 25.69))).toFixed(4).replace('.', ',')}`);
		await page.locator('textarea[name=points]').fill(rows.join('\n'));
		await page.getByRole('button', { name: 'Fit' }).click();
		await page.getByTestId('fit-results').waitFor();
		expect(await page.getByTestId('fit-results').textContent()).toMatch(/−?-?300\.\d ± \d/);
		expect(await page.locator('figure > svg').count()).toBe(2);
	});
	it('titration: a bad row is reported with its number', async () => {
		await page.goto('/calc/titration');
		await page.locator('textarea[name=points]').fill('-400,1\n-300,abc\n-200,0\n-100,0\n0,0');
		await page.getByRole('button', { name: 'Fit' }).click();
		expect(await page.locator('[data-field-error=points]').textContent()).toContain(
			'row 2, signal: "abc" is not a number'
		);
	});
	it('tunnelling: the default double well gives levels, an assessment and an isotope effect', async () => {
		await page.goto('/calc/tunnelling');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('level-results').waitFor();
		expect(await page.getByTestId('kappa-results').textContent()).toContain('κ Wigner');
		expect(await page.getByTestId('double-well').textContent()).toMatch(/splitting/);
		await page.screenshot({ path: 'test-results/tunnelling.png', fullPage: true });
	});
});
