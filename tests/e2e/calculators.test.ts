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
			'row 2: signal “abc” is not a number; expected a decimal number such as −400 or 0,98'
		);
	});
	it('tunnelling: the default double well gives levels, an assessment and an isotope effect', async () => {
		await page.goto('/calc/tunnelling');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('level-results').waitFor();
		expect(await page.getByTestId('kappa-results').textContent()).toContain('κ Wigner');
		expect(await page.getByTestId('double-well').textContent()).toMatch(/splitting/);
		expect(await page.getByTestId('grid-report').textContent()).toMatch(/decayed .* both ends/);
		// (Δ_H/Δ_D)² = 87.7, an order of magnitude: one significant figure.
		expect(await page.getByTestId('isotope-effect').textContent()).toContain('≈ 9 × 10¹');
		await page.screenshot({ path: 'test-results/tunnelling.png', fullPage: true });
	});
	it('tunnelling: every field has a label', async () => {
		await page.goto('/calc/tunnelling');
		const unlabelled = await page
			.locator('form[aria-label="Tunnelling inputs"]')
			.evaluate((form) =>
				[...form.querySelectorAll('input, select, textarea')]
					.filter(
						(el) =>
							!(el as HTMLInputElement).labels?.length &&
							!el.getAttribute('aria-label') &&
							!el.getAttribute('aria-labelledby')
					)
					.map((el) => el.getAttribute('name'))
			);
		expect(unlabelled).toEqual([]);
		expect(await page.getByLabel(/^Points: x \(Å\), V/).evaluate((el) => el.tagName)).toBe(
			'TEXTAREA'
		);
	});
	const tunnellingValues = {
		imagFreqCm1: '900',
		barrier: '12',
		temperatureK: '250',
		wellBarrier: '20',
		halfSeparationA: '0.4',
		asymmetry: '1',
		levels: '3'
	};
	const fillTunnelling = async (p: Page) => {
		await p.goto('/calc/tunnelling');
		await p.locator('select[name=energyUnit]').selectOption('kJ/mol');
		for (const [name, value] of Object.entries(tunnellingValues))
			await p.locator(`[name=${name}]`).fill(value);
		await p.locator('select[name=isotope]').selectOption('D');
	};
	const expectTunnellingKept = async (p: Page) => {
		for (const [name, value] of Object.entries(tunnellingValues))
			expect(await p.locator(`[name=${name}]`).inputValue(), name).toBe(value);
		expect(await p.locator('select[name=isotope]').inputValue()).toBe('D');
		expect(await p.locator('select[name=energyUnit]').inputValue()).toBe('kJ/mol');
		// Results in the unit chosen, and nowhere another energy unit.
		const results = (await p.locator('section[aria-live]').textContent()) ?? '';
		expect(results).toContain('kJ/mol');
		expect(results).not.toMatch(/kcal\/mol/);
	};
	it('tunnelling: a run keeps every value entered (with JavaScript)', async () => {
		await fillTunnelling(page);
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('level-results').waitFor();
		await expectTunnellingKept(page);
	});
	it('tunnelling: a run keeps every value entered (without JavaScript)', async () => {
		const context = await browser.newContext({ baseURL: base, javaScriptEnabled: false });
		try {
			const p = await context.newPage();
			await fillTunnelling(p);
			await p.getByRole('button', { name: 'Calculate' }).click();
			await p.getByTestId('level-results').waitFor();
			await expectTunnellingKept(p);
		} finally {
			await context.close();
		}
	});
	it('tunnelling: the unit switch converts the energies typed and the results shown', async () => {
		await page.goto('/calc/tunnelling');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('level-results').waitFor();
		const kcal = await page.getByTestId('double-well').textContent();
		expect(kcal).toContain('Barrier 6\u00a0kcal/mol');
		await page.locator('select[name=energyUnit]').selectOption('kJ/mol');
		expect(await page.locator('[name=wellBarrier]').inputValue()).toBe('25.104'); // 6 × 4.184
		expect(await page.getByTestId('double-well').textContent()).toContain(
			'Barrier 25.1\u00a0kJ/mol'
		);
		expect(await page.getByLabel(/^Barrier of the untilted well/).count()).toBe(1);
		expect(await page.getByText('Barrier of the untilted well (kJ/mol)').count()).toBe(1);
	});
	it('tunnelling: a tilt is explained beside the barrier, and no isotope effect when adiabatic', async () => {
		await page.goto('/calc/tunnelling');
		await page.locator('[name=asymmetry]').fill('0.2');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page.getByTestId('barrier-note').waitFor();
		expect(await page.getByTestId('barrier-note').textContent()).toMatch(/untilted well/);
		await page.locator('[name=wellBarrier]').fill('0.1');
		await page.locator('[name=asymmetry]').fill('0');
		await page.getByRole('button', { name: 'Calculate' }).click();
		await page
			.getByText(/vibrationally adiabatic/)
			.first()
			.waitFor();
		expect(await page.getByTestId('isotope-effect').count()).toBe(0);
	});
});
