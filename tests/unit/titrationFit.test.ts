import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitNernst, nernstFractionReduced, seededRandom, type TitrationPoint } from '$lib/science';

function synthetic(
	components: { emMv: number; n: number; amplitude: number }[],
	options: {
		offset?: number;
		noise?: number;
		seed?: number;
		from?: number;
		to?: number;
		count?: number;
	} = {}
): TitrationPoint[] {
	const { offset = 0.1, noise = 0, seed = 1, from = -550, to = 50, count = 40 } = options;
	const random = seededRandom(seed);
	return Array.from({ length: count }, (_, i) => {
		const e = from + ((to - from) * i) / (count - 1);
		const clean = components.reduce(
			(y, c) => y + c.amplitude * nernstFractionReduced(e, c.emMv, c.n, 298.15),
			offset
		);
		return { potentialMv: e, signal: clean + noise * random.normal() };
	});
}

describe('fitNernst', () => {
	it('recovers a noiseless one-electron titration exactly', () => {
		const fit = fitNernst(synthetic([{ emMv: -275, n: 1, amplitude: 1 }]), { components: 1, n: 1 });
		expect(fit.components[0]!.emMv).toBeCloseTo(-275, 4);
		expect(fit.components[0]!.amplitude).toBeCloseTo(1, 5);
		expect(fit.offset).toBeCloseTo(0.1, 5);
		expect(fit.rmsd).toBeLessThan(1e-6);
		expect(fit.components[0]!.nSe).toBeNull();
	});
	it('fits n when it is not given', () => {
		const fit = fitNernst(synthetic([{ emMv: -200, n: 2, amplitude: -0.8 }], { noise: 0.005 }), {
			components: 1
		});
		expect(fit.components[0]!.n).toBeCloseTo(2, 0);
		expect(fit.components[0]!.amplitude).toBeCloseTo(-0.8, 1);
	});
	it('separates two components 150 mV apart', () => {
		const fit = fitNernst(
			synthetic(
				[
					{ emMv: -380, n: 1, amplitude: 0.6 },
					{ emMv: -230, n: 1, amplitude: 0.4 }
				],
				{ noise: 0.004, count: 60 }
			),
			{ components: 2, n: 1 }
		);
		expect(fit.components.map((c) => Math.round(c.emMv / 10) * 10)).toEqual([-380, -230]);
	});
	it('recovers known parameters from noisy data within a few standard errors', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: -450, max: -100 }),
				fc.integer({ min: 1, max: 1_000_000 }),
				(em, seed) => {
					const fit = fitNernst(
						synthetic([{ emMv: em, n: 1, amplitude: 1 }], { noise: 0.02, seed }),
						{ components: 1, n: 1 }
					);
					const c = fit.components[0]!;
					expect(Math.abs(c.emMv - em)).toBeLessThan(5 * c.emSeMv);
					expect(c.emSeMv).toBeGreaterThan(0);
					expect(c.emSeMv).toBeLessThan(20);
				}
			),
			{ numRuns: 60 }
		);
	});
	/*
	 * An external case: the data come from the Nernst equation written out here, not from the
	 * library's nernstFractionReduced. Fraction reduced x = 1 / (1 + exp[nF(E − Em)/RT]), with
	 * CODATA 2018 (exact since the 2019 SI): F = 96485.33212 C/mol, R = 8.314462618 J/(mol K).
	 * A worked point: at E − Em = (RT/F)·ln 10 = 59.159 mV (n = 1, 298.15 K) the ratio ox/red is 10,
	 * so x = 1/11 exactly.
	 */
	describe('on a titration written out from the Nernst equation (CODATA 2018 F and R)', () => {
		const F = 96485.33212;
		const R = 8.314462618;
		const T = 298.15;
		const fractionReduced = (eMv: number, emMv: number, n: number) =>
			1 / (1 + Math.exp((n * F * ((eMv - emMv) / 1000)) / (R * T)));
		const titration = (emMv: number, n: number, amplitude: number, offset: number) =>
			Array.from({ length: 41 }, (_, i) => {
				const e = emMv - 200 + 10 * i;
				return { potentialMv: e, signal: offset + amplitude * fractionReduced(e, emMv, n) };
			});
		it('the worked point: ox/red = 10 at 59.159 mV above Em gives x = 1/11', () => {
			const slopeMv = ((R * T) / F) * Math.LN10 * 1000;
			expect(slopeMv).toBeCloseTo(59.159, 3);
			expect(fractionReduced(-250 + slopeMv, -250, 1)).toBeCloseTo(1 / 11, 12);
		});
		it('recovers Em, amplitude and offset of a one-electron centre (n fixed)', () => {
			const fit = fitNernst(titration(-345, 1, 0.72, 0.05), { components: 1, n: 1 });
			expect(fit.components[0]!.emMv).toBeCloseTo(-345, 4);
			expect(fit.components[0]!.amplitude).toBeCloseTo(0.72, 5);
			expect(fit.offset).toBeCloseTo(0.05, 5);
			expect(fit.rmsd).toBeLessThan(1e-6);
		});
		it('recovers n = 2 when n is fitted (a two-electron flavin-like step)', () => {
			const fit = fitNernst(titration(-180, 2, -0.4, 0.9), { components: 1 });
			expect(fit.components[0]!.n).toBeCloseTo(2, 4);
			expect(fit.components[0]!.emMv).toBeCloseTo(-180, 4);
			expect(fit.components[0]!.amplitude).toBeCloseTo(-0.4, 5);
		});
	});
	// Covariance s²(JᵀJ)⁻¹ (Numerical Recipes §15.5): about 95 % of fits should land within 1.96 SE.
	it('standard errors are calibrated (coverage near 95 %)', () => {
		let inside = 0;
		const runs = 300;
		for (let seed = 1; seed <= runs; seed++) {
			const fit = fitNernst(
				synthetic([{ emMv: -300, n: 1, amplitude: 1 }], { noise: 0.03, seed }),
				{ components: 1, n: 1 }
			);
			if (Math.abs(fit.components[0]!.emMv + 300) < 1.96 * fit.components[0]!.emSeMv) inside++;
		}
		expect(inside / runs).toBeGreaterThan(0.9);
		expect(inside / runs).toBeLessThan(0.99);
	});
	it('refuses too few points', () =>
		expect(() =>
			fitNernst(synthetic([{ emMv: -300, n: 1, amplitude: 1 }], { count: 4 }), {
				components: 1,
				n: 1
			})
		).toThrow(/4 points cannot determine 3 parameters/));
	it('refuses a flat signal', () =>
		expect(() => fitNernst(synthetic([], { count: 10 }), { components: 1, n: 1 })).toThrow(
			/does not change/
		));
	it('refuses data whose transition lies outside the measured range', () =>
		expect(() =>
			fitNernst(
				synthetic([{ emMv: -600, n: 1, amplitude: 1 }], { from: -300, to: 100, noise: 0.01 }),
				{ components: 1, n: 1 }
			)
		).toThrow(/no transition inside the measured range/));
	it('refuses non-finite values', () =>
		expect(() =>
			fitNernst(
				[
					...synthetic([{ emMv: -300, n: 1, amplitude: 1 }]),
					{ potentialMv: Number.NaN, signal: 1 }
				],
				{ components: 1 }
			)
		).toThrow(TypeError));
});
