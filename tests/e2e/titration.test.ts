import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium } from '../support/browser';
import { documentValidator } from '../support/openapiValidator';

const base = inject('baseUrl');
let browser: Browser;

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());

/*
 * Test data: a one-electron titration written out from the Nernst equation at 298.15 K
 * (RT/F = 25.693 mV, CODATA 2018), Em = −300 mV, in space-separated columns with the Unicode
 * minus and a decimal comma, as pasted from a typeset table.
 */
const titration = Array.from({ length: 26 }, (_, i) => {
	const e = -500 + 20 * i;
	const signal = 1 / (1 + Math.exp((e + 300) / 25.693));
	return `${String(e).replace('-', '\u2212')} ${signal.toFixed(4).replace('.', ',')}`;
}).join('\n');

// Noise only (a fixed, made-up sequence around 0.5): the old fit answered "Em = … ± … mV".
const noise = [
	0.51, 0.49, 0.5, 0.52, 0.48, 0.5, 0.51, 0.47, 0.5, 0.53, 0.49, 0.5, 0.48, 0.51, 0.5, 0.52, 0.49,
	0.5, 0.51, 0.48
]
	.map((signal, i) => `${-500 + 25 * i},${signal}`)
	.join('\n');

async function openPage(javaScriptEnabled: boolean): Promise<Page> {
	const context = await browser.newContext({ baseURL: base, javaScriptEnabled });
	const page = await context.newPage();
	await page.goto('/calc/titration');
	return page;
}

describe('titration page in Chromium', () => {
	for (const javaScriptEnabled of [true, false]) {
		it(`keeps every entered value after a run (JavaScript ${javaScriptEnabled ? 'on' : 'off'})`, async () => {
			const page = await openPage(javaScriptEnabled);
			await page.locator('textarea[name=points]').fill(titration);
			await page.getByLabel('n (electrons; leave empty to fit the apparent n)').fill('1');
			await page.getByLabel('Temperature (K)').fill('298,15');
			await page.getByRole('button', { name: 'Fit' }).click();
			await page.getByTestId('fit-results').waitFor();
			expect(await page.getByTestId('fit-results').textContent()).toMatch(/−300\.0 ± 0\.0/);
			expect(await page.getByTestId('fit-results').textContent()).toContain('Em (mV vs SHE)');
			expect(await page.locator('textarea[name=points]').inputValue()).toBe(titration);
			expect(
				await page.getByLabel('n (electrons; leave empty to fit the apparent n)').inputValue()
			).toBe('1');
			expect(await page.getByLabel('Temperature (K)').inputValue()).toBe('298,15');
			expect(await page.locator('input[name=components][value="1"]').isChecked()).toBe(true);

			// A second run with two components and n fitted: those choices are kept in turn.
			await page.locator('input[name=components][value="2"]').check();
			await page.getByLabel('n (electrons; leave empty to fit the apparent n)').fill('');
			await page.getByRole('button', { name: 'Fit' }).click();
			await page.getByTestId('no-transition').or(page.getByTestId('fit-results')).first().waitFor();
			await page.waitForFunction(
				() => !document.querySelector('input[name=components][value="1"]:checked')
			);
			expect(await page.locator('input[name=components][value="2"]').isChecked()).toBe(true);
			expect(
				await page.getByLabel('n (electrons; leave empty to fit the apparent n)').inputValue()
			).toBe('');
			expect(await page.getByLabel('Temperature (K)').inputValue()).toBe('298,15');
			expect(await page.locator('textarea[name=points]').inputValue()).toBe(titration);
			await page.context().close();
		});
	}

	it('answers noise with a message, not an Em', async () => {
		const page = await openPage(true);
		await page.locator('textarea[name=points]').fill(noise);
		await page.getByRole('button', { name: 'Fit' }).click();
		const message = page.getByTestId('no-transition');
		await message.waitFor();
		expect(await message.textContent()).toMatch(/No Em from these data/);
		expect(await message.textContent()).toMatch(/No Em is reported/);
		expect(await page.getByTestId('fit-results').count()).toBe(0);
		expect(await message.isVisible()).toBe(true);
		await page.context().close();
	});

	it('lists every row it could not read, hexadecimal included', async () => {
		const page = await openPage(true);
		await page.locator('textarea[name=points]').fill('-400 1\n0x10 0.9\n-300 abc\n-200 0\n-100 0');
		await page.getByRole('button', { name: 'Fit' }).click();
		const list = page.locator('[data-field-error=points] li');
		await list.first().waitFor();
		expect(await list.allTextContents()).toEqual([
			'row 2: potential “0x10” is not a number; expected a decimal number such as −400 or 0,98',
			'row 3: signal “abc” is not a number; expected a decimal number such as −400 or 0,98'
		]);
		await page.context().close();
	});
});

describe('POST /api/v1/calc/titration without a transition', () => {
	it('answers a structured no_transition, valid against the OpenAPI document, with no Em', async () => {
		const points = noise.split('\n').map((line) => {
			const [potentialMv, signal] = line.split(',').map(Number);
			return { potentialMv, signal };
		});
		const res = await fetch(`${base}/api/v1/calc/titration`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify({ points, components: 1, n: 1 })
		});
		expect(res.status).toBe(200);
		const body = (await res.json()) as Record<string, unknown>;
		expect(body.outcome).toBe('no_transition');
		expect(body.message).toMatch(/No Em is reported/);
		expect(body).not.toHaveProperty('components');
		expect(body.units).toMatchObject({ emMv: expect.stringMatching(/^mV vs SHE/) });
		const doc = (await (await fetch(`${base}/api/v1/openapi.json`)).json()) as {
			components: { schemas: Record<string, unknown> };
		};
		const schema = { $ref: '#/components/schemas/TitrationFit' };
		expect(documentValidator(doc).validate(schema, body).errors).toEqual([]);
	});
});
