import { describe, expect, it } from 'vitest';
import { MIN_HOP_DISTANCE_A, hopRateQuerySchema, type HopRateQuery } from '$lib/schemas/calc';
import { NOT_A_DECIMAL } from '$lib/schemas/decimal';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { hopRateAnswer } from '$lib/server/calc/answers';
import { RATE_CAUTION, runHopRate } from '$lib/server/calc/hopRate';
import { BOLTZMANN_EV_PER_K, moserDuttonLog10Rate } from '$lib/science';

const read = (qs: string) => parseSearchParams(hopRateQuerySchema, new URLSearchParams(qs));
const query = (qs: string): HopRateQuery => {
	const r = read(qs);
	if (!r.ok) throw new Error(JSON.stringify(r.fields));
	return r.data;
};

describe('hop-rate inputs (the page and GET /api/v1/calc/hop-rate)', () => {
	// Moser et al., Nature 355, 796 (1992): the ruler is anchored at van der Waals contact, 3.6 Å.
	it('refuses distances below van der Waals contact (3.6 Å), saying why', () => {
		expect(MIN_HOP_DISTANCE_A).toBe(3.6);
		for (const d of ['0', '3.59', '\u22121']) {
			const r = read(`distance=${d}&dG=-0.1&lambda=0.7`);
			expect(r.ok, d).toBe(false);
			expect(!r.ok && r.fields.distance?.[0]).toMatch(/from 3\.6 Å to 100 Å \(.*van der Waals/);
		}
		expect(query('distance=3.6&dG=-0.1&lambda=0.7').distance).toBe(3.6);
	});

	// distance=0x10 was read as 16 Å; '' as absent; Infinity and 1e400 are no distances.
	it.each(['0x10', 'Infinity', '1e400', '16Å'])('refuses distance=%s as not a decimal', (d) => {
		const r = read(`distance=${encodeURIComponent(d)}&dG=-0.1&lambda=0.7`);
		expect(r.ok).toBe(false);
		expect(!r.ok && r.fields.distance?.[0]).toContain(NOT_A_DECIMAL);
	});
	it('an empty required field is missing, an empty optional one takes its default', () => {
		const r = read('distance=&dG=-0.1&lambda=0.7');
		expect(!r.ok && r.fields.distance?.[0]).toMatch(/^required/);
		expect(query('distance=10&dG=-0.1&lambda=0.7&temperature=&packing=').temperature).toBe(298.15);
	});

	it('reads the Unicode minus and a decimal comma in every field', () => {
		const q = query(
			'distance=10,5&dG=\u22120,12&lambda=0,7&temperature=310,5&packing=0,7&h0=0,02&beta=1,3'
		);
		expect(q).toMatchObject({
			distance: 10.5,
			dG: -0.12,
			lambda: 0.7,
			temperature: 310.5,
			packing: 0.7,
			h0: 0.02,
			beta: 1.3
		});
	});
});

describe('hop-rate results', () => {
	// Regression: distance=0 with model=marcus gave log k = 15.1. At the shortest distance allowed
	// and the activationless driving force the default Marcus coupling gives the ruler's contact
	// rate, 10¹³ s⁻¹ (Moser et al. 1992), and never more.
	it('Marcus at contact gives the ruler’s contact rate and no more', () => {
		const top = hopRateAnswer(query('distance=3.6&dG=-0.7&lambda=0.7&model=marcus'));
		expect(top.log10RateForward).toBeCloseTo(13, 9);
		for (const dG of ['-0.2', '-0.7', '-1.2', '0.3'])
			expect(
				hopRateAnswer(query(`distance=3.6&dG=${dG}&lambda=0.7&model=marcus`)).log10RateForward
			).toBeLessThanOrEqual(13 + 1e-9);
	});

	// One uphill rule: detailed balance at T (k_B from CODATA 2018). The downhill Moser–Dutton rate
	// does not move with T; the uphill one moves by |ΔG°|/(k_B T ln 10) decades.
	it('uses detailed balance at the temperature entered, for both models', () => {
		for (const t of [250, 298.15, 350]) {
			const r = runHopRate(query(`distance=9&dG=0.15&lambda=0.8&temperature=${t}`));
			const decades = 0.15 / (BOLTZMANN_EV_PER_K * t * Math.LN10);
			expect(r.detailedBalance.decades).toBeCloseTo(decades, 12);
			for (const e of Object.values(r.estimates))
				expect(e.log10RateBackward - e.log10RateForward).toBeCloseTo(decades, 9);
			const md = r.estimates['moser-dutton'];
			expect(md.log10RateBackward).toBe(
				moserDuttonLog10Rate({ edgeDistanceA: 9, deltaGEv: -0.15, lambdaEv: 0.8 }).log10Rate
			);
			// The uphill rate is what the science function gives for ΔG° > 0 at that T.
			expect(md.log10RateForward).toBeCloseTo(
				moserDuttonLog10Rate({
					edgeDistanceA: 9,
					deltaGEv: 0.15,
					lambdaEv: 0.8,
					temperatureK: t
				}).log10Rate,
				12
			);
		}
	});

	it('the plot reaches the distance asked about', () => {
		const r = runHopRate(query('distance=40&dG=-0.1&lambda=0.7'));
		expect(r.curve[0]?.distanceA).toBe(3.6);
		expect(r.curve.at(-1)?.distanceA).toBeCloseTo(40, 9);
	});

	it('the caution names each model, its range, its typical error and its sources', () => {
		expect(RATE_CAUTION).toMatch(/order of magnitude/);
		expect(RATE_CAUTION).toMatch(/rule of thumb, not a published figure/);
		expect(RATE_CAUTION).not.toMatch(/no source|from memory/);
		expect(RATE_CAUTION).toMatch(/Nature 355, 796/);
		expect(RATE_CAUTION).toMatch(/no temperature in it/);
	});
});
