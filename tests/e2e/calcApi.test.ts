import { describe, expect, inject, it } from 'vitest';
import { moserDuttonRate, nernstFractionReduced } from '$lib/science';
import type { ApiErrorBody } from '$lib/schemas/apiError';

const base = inject('baseUrl');
const post = (path: string, body: unknown, contentType = 'application/json') =>
	fetch(base + path, {
		method: 'POST',
		headers: { 'content-type': contentType, origin: base },
		body: typeof body === 'string' ? body : JSON.stringify(body)
	});

describe('calculator API over HTTP', () => {
	it('hop rate matches the science engine and carries its caution', async () => {
		const res = await fetch(
			`${base}/api/v1/calc/hop-rate?distance=10&dG=-0.1&lambda=0.7&model=moser-dutton`
		);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(
			body.rateForward / moserDuttonRate({ edgeDistanceA: 10, deltaGEv: -0.1, lambdaEv: 0.7 }).rate
		).toBeCloseTo(1, 9);
		expect(body.rateBackward).toBeLessThan(body.rateForward);
		expect(body).toMatchObject({ model: 'moser-dutton', warnings: [] });
		expect(body.caution).toMatch(/order of magnitude/);
	});
	it('hop rate names missing and bad parameters', async () => {
		const res = await fetch(`${base}/api/v1/calc/hop-rate?distance=ten&lambda=0&model=quantum`);
		expect(res.status).toBe(400);
		const body = (await res.json()) as ApiErrorBody;
		expect(Object.keys(body.error.fields ?? {}).sort()).toEqual([
			'dG',
			'distance',
			'lambda',
			'model'
		]);
		expect(body.error.fields?.dG?.[0]).toMatch(/^required/);
	});
	// Regressions: distance=0 gave log k = 15.1 under Marcus (above the ruler's 10¹³ s⁻¹ at contact,
	// Moser et al., Nature 355, 796 (1992)); distance=0x10 was read as 16 Å.
	it('hop rate refuses distances below contact and numbers that are not plain decimals', async () => {
		for (const distance of ['0', '3.5', '0x10', 'Infinity', '1e400', '']) {
			const res = await fetch(
				`${base}/api/v1/calc/hop-rate?distance=${distance}&dG=-0.1&lambda=0.7&model=marcus`
			);
			expect(res.status, distance).toBe(400);
			const body = (await res.json()) as ApiErrorBody;
			expect(body.error.fields?.distance?.[0], distance).toMatch(
				distance === '' ? /^required/ : /3\.6 Å to 100 Å/
			);
		}
		const zero = (await (
			await fetch(`${base}/api/v1/calc/hop-rate?distance=0&dG=-0.1&lambda=0.7`)
		).json()) as ApiErrorBody;
		expect(zero.error.fields?.distance?.[0]).toMatch(/van der Waals contact/);
	});
	it('hop rate reads the Unicode minus and a decimal comma in every parameter', async () => {
		const typed = new URLSearchParams({
			distance: '10,5',
			dG: '\u22120,12',
			lambda: '0,7',
			temperature: '310,5',
			packing: '0,7',
			h0: '0,02',
			beta: '1,3',
			model: 'marcus'
		});
		const res = await fetch(`${base}/api/v1/calc/hop-rate?${typed}`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.inputs).toMatchObject({
			distance: 10.5,
			dG: -0.12,
			lambda: 0.7,
			temperature: 310.5,
			packing: 0.7,
			h0: 0.02,
			beta: 1.3
		});
	});
	it('titration fit recovers a synthetic Em', async () => {
		const points = Array.from({ length: 31 }, (_, i) => {
			const e = -500 + i * 15;
			return { potentialMv: e, signal: nernstFractionReduced(e, -260, 1, 298.15) };
		});
		const res = await post('/api/v1/calc/titration', { points, components: 1, n: 1 });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.components[0].emMv).toBeCloseTo(-260, 3);
	});
	it('titration refuses bad bodies with field errors', async () => {
		expect((await post('/api/v1/calc/titration', 'potential,signal', 'text/plain')).status).toBe(
			400
		);
		expect((await post('/api/v1/calc/titration', '{"points": [', 'application/json')).status).toBe(
			400
		);
		const res = await post('/api/v1/calc/titration', {
			points: [{ potentialMv: 'x', signal: 1 }],
			components: 3
		});
		const body = (await res.json()) as ApiErrorBody;
		expect(res.status).toBe(400);
		expect(Object.keys(body.error.fields ?? {})).toEqual(
			expect.arrayContaining(['points', 'points.0.potentialMv', 'components'])
		);
	});
	it('tunnelling returns factors and levels, never NaN', async () => {
		const res = await post('/api/v1/calc/tunnelling', {
			imagFreqCm1: 1000,
			barrierKJmol: 40,
			potential: { kind: 'double-well', barrierKcalMol: 8, halfSeparationA: 0.35 },
			levels: 4
		});
		expect(res.status).toBe(200);
		const text = await res.text();
		expect(text).not.toMatch(/NaN|Infinity|null,"bell"/);
		const body = JSON.parse(text);
		expect(body.kappa.bell).toBeGreaterThan(body.kappa.wigner);
		expect(body.levels.energiesKcalMol).toHaveLength(4);
		expect(body.isotopeEffect.kie).toBeGreaterThan(1);
	});
	// Regression: κ ≈ 1e408 overflowed to Infinity and the answer was a 500.
	it('tunnelling far below the crossover temperature answers log₁₀ κ, never a 500', async () => {
		const res = await post('/api/v1/calc/tunnelling', {
			imagFreqCm1: 1000,
			temperatureK: 50,
			barrierKJmol: 500
		});
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.kappa.bellTruncated).toBeNull();
		// 408.3902328452719 by mpmath 1.3.0 at 50 digits (tests/unit/tunnelling.test.ts).
		expect(body.kappa.bellTruncatedLog10).toBeCloseTo(408.39023, 4);
		expect(body.kappa.notes.join(' ')).toMatch(/exceeds double precision/);
	});
	it('tunnelling reports the grid it chose, or keeps the one given', async () => {
		const well = { kind: 'double-well', barrierKcalMol: 0.01, halfSeparationA: 0.05 };
		const chosen = await (
			await post('/api/v1/calc/tunnelling', { potential: well, levels: 2 })
		).json();
		// E₀ = 1.5527 kcal/mol (oscillator-basis reference, tests/unit/tunnelling.test.ts); 7.57 before.
		expect(chosen.levels.energiesKcalMol[0]).toBeCloseTo(1.55273, 4);
		expect(chosen.levels.grid).toMatchObject({ converged: true, range: 'automatic' });
		const given = await (
			await post('/api/v1/calc/tunnelling', {
				potential: well,
				levels: 2,
				xMinA: -0.125,
				xMaxA: 0.125,
				points: 400
			})
		).json();
		expect(given.levels.grid).toMatchObject({ range: 'given', points: 400, converged: false });
		expect(given.levels.energiesKcalMol[0]).toBeCloseTo(7.5708, 3);
		expect(given.notes.join(' ')).toMatch(/not converged/);
		const oneEnd = await post('/api/v1/calc/tunnelling', { potential: well, xMinA: -1 });
		expect(oneEnd.status).toBe(400);
		expect(((await oneEnd.json()) as ApiErrorBody).error.fields?.xMaxA?.[0]).toMatch(/both ends/);
	});
	it('tunnelling needs a frequency or a potential', async () => {
		const res = await post('/api/v1/calc/tunnelling', { temperatureK: 300 });
		expect(res.status).toBe(400);
		expect(((await res.json()) as ApiErrorBody).error.fields?.imagFreqCm1).toBeDefined();
	});
});
