import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { launchChromium } from '../support/browser';

/*
 * The calculators' forms as a reader uses them (issue 14 §3): inputs kept after every run, with
 * and without JavaScript; typed numbers (Unicode minus, decimal comma, spaces) read everywhere;
 * bad rows listed once each, capped; the hop rate filled in from two centres of a protein, with
 * the source of each filled value; an "API:" line that follows the inputs and works; true minus
 * signs in what is shown; no serious accessibility fault; nothing wider than a phone.
 *
 * Oracle for the hop-rate values: seed/demo.ts — RoxA–H's FMN (HL000008; ox/hq −340 mV at pH 7)
 * and cluster C2 (HL000010; [4Fe-4S]2+/1+ −250 mV), 8.4 Å edge to edge (distance HL000102):
 * ΔG° = −0.09 eV. The demo's accessions are fixed by its load order (the protein pages use them).
 */
const base = inject('baseUrl');
const FMN = 'HL000008';
const C2 = 'HL000010';
let browser: Browser;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => {
	for (const c of contexts) await c.close();
	await browser?.close();
});

async function newPage(
	javaScriptEnabled = true,
	viewport = { width: 1366, height: 900 }
): Promise<Page> {
	const context = await browser.newContext({
		baseURL: base,
		javaScriptEnabled,
		viewport,
		bypassCSP: true
	});
	contexts.push(context);
	return context.newPage();
}
const modes = [true, false] as const;
const label = (js: boolean) => (js ? 'with JavaScript' : 'without JavaScript');

/** A one-electron titration at 298.15 K (RT/F = 25.693 mV, CODATA 2018), Em = −300 mV. */
const titration = Array.from({ length: 21 }, (_, i) => {
	const e = -500 + 20 * i;
	const signal = 1 / (1 + Math.exp((e + 300) / 25.693));
	return `${String(e).replace('-', '\u2212')} ${signal.toFixed(4).replace('.', ',')}`;
}).join('\n');

describe('titration form', () => {
	for (const js of modes) {
		it(`keeps a fixed n fixed over two runs, ${label(js)}`, async () => {
			const page = await newPage(js);
			await page.goto('/calc/titration');
			await page.locator('textarea[name=points]').fill(titration);
			await page.getByLabel(/^n \(electrons/).fill(' 2 ');
			await page.getByLabel('Temperature (K)').fill(' 298,15 ');
			for (let run = 0; run < 2; run++) {
				await page.getByRole('button', { name: 'Fit' }).click();
				await page.getByTestId('fit-results').waitFor();
				// n was set: it stays set, and the fit keeps it fixed rather than fitting it.
				expect(await page.getByLabel(/^n \(electrons/).inputValue()).toBe(' 2 ');
				expect(await page.getByLabel('Temperature (K)').inputValue()).toBe(' 298,15 ');
				expect(await page.getByTestId('fit-results').textContent()).toContain('2 (fixed)');
				expect(await page.locator('textarea[name=points]').inputValue()).toBe(titration);
			}
			// Unicode minus wherever a number is shown in the results.
			const results = (await page.locator('[aria-live=polite]').textContent()) ?? '';
			expect(results).toMatch(/−\d/);
			expect(results).not.toMatch(/(^|[\s(])-\d/);
		});

		it(`lists each bad row once, capped, ${label(js)}`, async () => {
			const page = await newPage(js);
			await page.goto('/calc/titration');
			// Thirty rows with three cells, and one with a word: 31 rows with problems.
			const rows = Array.from({ length: 30 }, (_, i) => `-${400 - i} 0.5 0.1`);
			rows.splice(3, 0, '-300 abc');
			await page.locator('textarea[name=points]').fill(rows.join('\n'));
			await page.getByRole('button', { name: 'Fit' }).click();
			const items = page.locator('[data-field-error=points] li');
			await items.first().waitFor();
			const list = await items.allTextContents();
			expect(list).toHaveLength(21);
			expect(list[0]).toBe('row 1: found 3 columns; expected two (potential, signal)');
			expect(list[3]).toMatch(/^row 4: signal “abc” is not a number; expected a decimal number/);
			expect(list[20]).toBe('and 11 more rows with problems');
			expect(new Set(list).size).toBe(list.length);
		});
	}

	it('lists a point out of range under its line number', async () => {
		const page = await newPage();
		await page.goto('/calc/titration');
		await page
			.locator('textarea[name=points]')
			.fill('E signal\n\n-400 1\n-300 0.5\n5000 0.2\n-100 0');
		await page.getByRole('button', { name: 'Fit' }).click();
		const items = page.locator('[data-field-error=points] li');
		await items.first().waitFor();
		expect(await items.allTextContents()).toEqual([
			'row 5: potential 5000: expected a number from −3000 to 3000 mV'
		]);
	});

	it('shows a working API request for the points as typed', async () => {
		const page = await newPage();
		await page.goto('/calc/titration');
		await page.locator('textarea[name=points]').fill(titration);
		await page.getByLabel(/^n \(electrons/).fill('');
		const line = await page.getByTestId('api-request').inputValue();
		expect(line).toContain(`curl -X POST '${base}/api/v1/calc/titration'`);
		const body = JSON.parse(/-d '(.*)'$/.exec(line)![1]!) as Record<string, unknown>;
		expect(body).not.toHaveProperty('n'); // left empty: the apparent n is fitted
		expect((body.points as unknown[]).length).toBe(21);
		const res = await fetch(`${base}/api/v1/calc/titration`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(body)
		});
		expect(res.status).toBe(200);
		const answer = (await res.json()) as { components: { emMv: number }[] };
		expect(answer.components[0]!.emMv).toBeCloseTo(-300, 0);
	});
});

describe('tunnelling form', () => {
	for (const js of modes) {
		it(`reads and keeps a decimal comma and a Unicode minus, ${label(js)}`, async () => {
			const page = await newPage(js);
			await page.goto('/calc/tunnelling');
			const typed = {
				imagFreqCm1: ' 1100,5 ',
				temperatureK: '300,0',
				wellBarrier: '5,5',
				halfSeparationA: '0,4',
				asymmetry: '\u22120,3',
				levels: '4'
			};
			for (const [name, value] of Object.entries(typed))
				await page.locator(`[name=${name}]`).fill(value);
			await page.getByRole('button', { name: 'Calculate' }).click();
			await page.getByTestId('level-results').waitFor();
			// With JavaScript the field keeps the text as typed; without, the page shows what the
			// server read (trimmed).
			for (const [name, value] of Object.entries(typed))
				expect(await page.locator(`[name=${name}]`).inputValue(), name).toBe(
					js ? value : value.trim()
				);
			expect(await page.getByTestId('level-results').locator('tbody tr').count()).toBe(4);
			expect(await page.getByTestId('grid-report').textContent()).not.toMatch(/\d-\d|e-\d/);
		});
	}

	it('shows the API request as the fields change, and it works', async () => {
		const page = await newPage();
		await page.goto('/calc/tunnelling');
		await page.locator('[name=levels]').fill('3');
		await page.locator('[name=asymmetry]').fill('\u22120,2');
		const line = await page.getByTestId('api-request').inputValue();
		const body = JSON.parse(/-d '(.*)'$/.exec(line)![1]!) as {
			levels: number;
			potential: { asymmetryKcalMol: number };
		};
		expect(body.levels).toBe(3);
		expect(body.potential.asymmetryKcalMol).toBe(-0.2);
		const res = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(body)
		});
		expect(res.status).toBe(200);
	});
});

describe('hop rate from two centres of a protein', () => {
	for (const js of modes) {
		it(`a link with donor and acceptor fills ΔG° and the distance, with their sources, ${label(js)}`, async () => {
			const page = await newPage(js);
			await page.goto(`/calc/hop-rate?donor=${FMN}&acceptor=${C2}`);
			await page.getByTestId('hop-results').waitFor();
			expect(await page.locator('input[name=dG]').inputValue()).toBe('−0.09');
			expect(await page.locator('input[name=distance]').inputValue()).toBe('8.4');
			expect(await page.locator('input[name=lambda]').inputValue()).toBe('0.7');
			expect(await page.locator('select[name=donor]').inputValue()).toBe(FMN);
			expect(await page.locator('select[name=acceptor]').inputValue()).toBe(C2);
			const dG = (await page.getByTestId('dG-source').textContent()) ?? '';
			expect(dG).toMatch(/^\s*Filled in\s+−0\.09 eV/);
			expect(dG).toMatch(/−340\smV/);
			expect(dG).toMatch(/−250\smV/);
			expect(dG).toMatch(/two-electron couple used as an approximation/);
			expect(await page.getByTestId('distance-source').textContent()).toMatch(
				/Filled in\s+8\.4\sÅ edge to edge from distance entry HL\d{6}/
			);
			// Still editable: a value typed over the filled one is kept and used; the registry's is shown.
			await page.locator('input[name=dG]').fill('\u22120,25');
			await page.locator('input[name=dG]').press('Enter');
			await page.waitForURL(/dG=%E2%88%920%2C25/);
			await page.getByTestId('hop-results').waitFor();
			expect(await page.locator('input[name=dG]').inputValue()).toBe('−0,25');
			expect(await page.locator('input[name=distance]').inputValue()).toBe('8.4');
			expect(await page.getByTestId('dG-source').textContent()).toMatch(
				/You changed this value; the registry gives\s+−0\.09 eV/
			);
			// The API line says what was computed, and answers the rate the page shows.
			const href = await page.getByTestId('api-line').locator('a').getAttribute('href');
			expect(href).toBe(
				`${base}/api/v1/calc/hop-rate?distance=8.4&dG=-0.25&lambda=0.7&model=moser-dutton`
			);
			const api = (await (await fetch(href!)).json()) as { log10RateForward: number };
			const shown = await page.getByTestId('hop-results').locator('tbody tr').first().textContent();
			expect(shown).toContain(api.log10RateForward.toFixed(2));
			// "Fill" asks for the registry's values again.
			await page.getByRole('button', { name: 'Fill ΔG° and distance' }).click();
			await page.waitForURL(/dG=%E2%88%920\.09/);
			expect(await page.locator('input[name=dG]').inputValue()).toBe('−0.09');
		});
	}

	it('with JavaScript: a protein typed, then two centres chosen, fill the form', async () => {
		const page = await newPage();
		await page.goto('/calc/hop-rate');
		const protein = page.getByLabel('Protein (name or accession)');
		await protein.fill('RoxA');
		await page.waitForFunction(
			() => document.querySelectorAll('#protein-suggestions option').length > 0
		);
		await protein.press('Tab');
		await page.waitForURL(/protein=RoxA/);
		await page.locator(`select[name=donor] option[value=${FMN}]`).waitFor({ state: 'attached' });
		await page.locator('select[name=donor]').selectOption(FMN);
		await page.locator('select[name=acceptor]').selectOption(C2);
		await page.waitForURL(/dG=/);
		await page.getByTestId('hop-results').waitFor();
		expect(await page.locator('input[name=distance]').inputValue()).toBe('8.4');
		// The API line follows what is typed, before any run.
		await page.locator('input[name=lambda]').fill('0,9');
		expect(await page.getByTestId('api-line').textContent()).toContain('lambda=0.9');
	});

	it('without JavaScript: words of a protein name list its centres', async () => {
		const page = await newPage(false);
		await page.goto('/calc/hop-rate');
		await page.getByLabel('Protein (name or accession)').fill('RoxA');
		await page.getByRole('button', { name: 'Find centres' }).click();
		await page.getByTestId('hop-protein').waitFor();
		expect(await page.locator('select[name=donor] option').count()).toBeGreaterThan(3);
		await page.locator('select[name=donor]').selectOption(FMN);
		await page.locator('select[name=acceptor]').selectOption(C2);
		await page.getByRole('button', { name: 'Fill ΔG° and distance' }).click();
		await page.getByTestId('hop-results').waitFor();
		expect(await page.locator('input[name=dG]').inputValue()).toBe('−0.09');
	});

	it('answers an unknown centre as "not in the registry (or not visible to you)"', async () => {
		const page = await newPage();
		await page.goto(`/calc/hop-rate?donor=HL999999&acceptor=${C2}`);
		expect(await page.locator('[data-field-error=donor]').textContent()).toBe(
			'no centre HL999999 in the registry (or not visible to you)'
		);
	});

	it('shows rates as powers of ten with true minus signs', async () => {
		const page = await newPage();
		await page.goto('/calc/hop-rate?distance=30&dG=-0.6&lambda=0.7');
		const table = (await page.getByTestId('hop-results').textContent()) ?? '';
		expect(table).toMatch(/× 10⁻?[⁰¹²³⁴⁵⁶⁷⁸⁹]+/);
		expect(table).not.toMatch(/e[+-]\d|-\d/);
		const warnings = await page.getByTestId('hop-warning').allTextContents();
		expect(warnings.length).toBeGreaterThan(0);
		for (const w of warnings) expect(w).not.toMatch(/(^|\s)-\d|e-\d/);
	});
});

describe('text typed before the page’s script has started', () => {
	/**
	 * Opens a calculator with its scripts held back, lets `type` fill the server-rendered form,
	 * then lets the scripts load and waits until the page has started (hydration done).
	 */
	async function typeBeforeHydration(path: string, type: (page: Page) => Promise<void>) {
		const page = await newPage();
		const held: (() => Promise<void>)[] = [];
		const scripts = '**/_app/immutable/**/*.js';
		await page.route(scripts, (route) => {
			held.push(() => route.continue());
		});
		// The document has arrived; its module scripts wait (and so does DOMContentLoaded).
		await page.goto(path, { waitUntil: 'commit' });
		await page.locator('form button').last().waitFor();
		await type(page);
		for (const go of held.splice(0)) await go();
		await page.unroute(scripts);
		await page.waitForLoadState('networkidle');
		return page;
	}

	it('titration: kept, and the API line follows it', async () => {
		const page = await typeBeforeHydration('/calc/titration', async (p) => {
			await p.locator('textarea[name=points]').fill('-400 1\n-300 0.5\n-200 0');
			await p.getByLabel(/^n \(electrons/).fill('2');
			await p.getByLabel('two').check();
		});
		expect(await page.locator('textarea[name=points]').inputValue()).toBe(
			'-400 1\n-300 0.5\n-200 0'
		);
		expect(await page.getByLabel(/^n \(electrons/).inputValue()).toBe('2');
		expect(await page.getByLabel('two').isChecked()).toBe(true);
		const api = await page.getByTestId('api-request').inputValue();
		expect(api).toContain('"potentialMv":-300');
		expect(api).toContain('"components":2');
	});

	it('tunnelling: kept, and the API line follows it', async () => {
		const page = await typeBeforeHydration('/calc/tunnelling', async (p) => {
			await p.getByLabel(/^Imaginary frequency/).fill('1234');
		});
		expect(await page.getByLabel(/^Imaginary frequency/).inputValue()).toBe('1234');
		expect(await page.getByTestId('api-request').inputValue()).toContain('1234');
	});

	it('hop rate: kept, and the API line follows it', async () => {
		const page = await typeBeforeHydration('/calc/hop-rate', async (p) => {
			await p.getByLabel(/^Edge-to-edge distance/).fill('12.5');
		});
		expect(await page.getByLabel(/^Edge-to-edge distance/).inputValue()).toBe('12.5');
		expect(await page.getByTestId('api-line').textContent()).toContain('distance=12.5');
	});
});

describe('the calculators, accessible and within a phone’s width', () => {
	const states: [string, (page: Page) => Promise<void>][] = [
		['/calc', async (p) => void (await p.goto('/calc'))],
		[
			'hop rate filled from two centres',
			async (p) => {
				await p.goto(`/calc/hop-rate?donor=${FMN}&acceptor=${C2}`);
				await p.getByTestId('hop-results').waitFor();
			}
		],
		[
			'hop rate with several proteins to choose from',
			async (p) => {
				await p.goto('/calc/hop-rate?protein=ferredoxin');
				await p.getByTestId('protein-matches').waitFor();
			}
		],
		[
			'titration with bad rows',
			async (p) => {
				await p.goto('/calc/titration');
				await p.locator('textarea[name=points]').fill('-400 x\n-300 0.5 1\n-200 0\n-100 0');
				await p.getByRole('button', { name: 'Fit' }).click();
				await p.locator('[data-field-error=points]').waitFor();
			}
		],
		[
			'titration fitted',
			async (p) => {
				await p.goto('/calc/titration');
				await p.locator('textarea[name=points]').fill(titration);
				await p.getByRole('button', { name: 'Fit' }).click();
				await p.getByTestId('fit-results').waitFor();
			}
		],
		[
			'tunnelling computed',
			async (p) => {
				await p.goto('/calc/tunnelling');
				await p.getByRole('button', { name: 'Calculate' }).click();
				await p.getByTestId('level-results').waitFor();
			}
		]
	];
	for (const [name, open] of states) {
		it(`${name}: no critical or serious axe violation, no sideways scroll at 390 px`, async () => {
			const wide = await newPage();
			await open(wide);
			expect(await seriousViolations(wide)).toEqual([]);
			const phone = await newPage(true, { width: 390, height: 844 });
			await open(phone);
			expect(
				await phone.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
			).toBe(0);
			expect(await seriousViolations(phone)).toEqual([]);
		});
	}
});
