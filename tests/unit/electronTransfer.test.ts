import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	BOLTZMANN_EV_PER_K,
	couplingAtDistance,
	deltaGFromPotentials,
	detailedBalanceDecades,
	hopRatePair,
	marcusRate,
	moserDuttonLog10Rate,
	moserDuttonRate,
	reverseRate
} from '$lib/science';

describe('Moser–Dutton ruler', () => {
	// Moser et al., Nature 355, 796 (1992): log10 k = 13 at van der Waals contact (3.6 Å) when −ΔG° = λ.
	it('is 10^13 s⁻¹ at contact and optimal driving force', () => {
		const r = moserDuttonRate({ edgeDistanceA: 3.6, deltaGEv: -0.8, lambdaEv: 0.8 });
		expect(r.log10Rate).toBeCloseTo(13, 12);
		expect(r.rate).toBeCloseTo(1e13, -6);
	});
	// Page et al., Nature 402, 47 (1999), eq. 1: slope (1.2 − 0.8ρ) per Å; ρ = 0.76 gives 0.592 decades/Å,
	// i.e. β = 0.592·ln 10 = 1.36 Å⁻¹ (quoted there as β ≈ 1.4 Å⁻¹).
	it('falls by 1.2 − 0.8ρ decades per Å', () => {
		const at = (r: number) =>
			moserDuttonLog10Rate({ edgeDistanceA: r, deltaGEv: -0.5, lambdaEv: 0.7 }).log10Rate;
		expect(at(10) - at(11)).toBeCloseTo(0.592, 12);
		expect((at(10) - at(11)) * Math.LN10).toBeCloseTo(1.363, 3);
	});
	it('a packing density of 0 gives the vacuum-like 1.2 decades per Å', () => {
		const at = (r: number) =>
			moserDuttonLog10Rate({ edgeDistanceA: r, deltaGEv: -0.5, lambdaEv: 0.7, packingDensity: 0 })
				.log10Rate;
		expect(at(8) - at(9)).toBeCloseTo(1.2, 12);
	});
	// Page, Moser, Chen & Dutton, Nature 402, 47–52 (1999), eq. 2: the published endergonic form
	// 13 − (1.2 − 0.8ρ)(R − 3.6) − 3.1(−ΔG° + λ)²/λ − ΔG°/0.06, written out here by hand. It is
	// detailed balance at the T where k_B·T·ln 10 = 0.06 eV (k_B = 8.617333262e-5 eV/K, CODATA 2018:
	// T = 302.39 K); there the ruler, which uses detailed balance at the stated T, must agree with it.
	it('reproduces the published endergonic form at T where k_B T ln 10 = 0.06 eV', () => {
		const t = 0.06 / (8.617333262e-5 * Math.LN10);
		expect(t).toBeCloseTo(302.39, 2);
		for (const [r, dg, lambda] of [
			[9, 0.12, 0.7],
			[5, 0.4, 1.1],
			[14, 0.05, 0.5]
		] as const) {
			const published =
				13 - (1.2 - 0.8 * 0.76) * (r - 3.6) - (3.1 * (-dg + lambda) ** 2) / lambda - dg / 0.06;
			const ours = moserDuttonLog10Rate({
				edgeDistanceA: r,
				deltaGEv: dg,
				lambdaEv: lambda,
				temperatureK: t
			}).log10Rate;
			expect(ours).toBeCloseTo(published, 9);
		}
	});
	// Detailed balance at 298.15 K: 1/(k_B T ln 10) = 16.9035 decades per eV (CODATA 2018 k_B);
	// the published 1/0.06 = 16.6667, so the two differ by 0.2368 decades per eV (the 0.24).
	it('uses detailed balance at the stated temperature for the uphill direction', () => {
		const base = { edgeDistanceA: 9, lambdaEv: 0.7 };
		const down = moserDuttonLog10Rate({ ...base, deltaGEv: -0.12 }).log10Rate;
		const up = moserDuttonLog10Rate({ ...base, deltaGEv: 0.12 }).log10Rate;
		expect(down - up).toBeCloseTo(0.12 * 16.9035, 3);
		expect(down - up - 0.12 / 0.06).toBeCloseTo(0.12 * 0.2368, 4);
		const up77 = moserDuttonLog10Rate({ ...base, deltaGEv: 0.12, temperatureK: 77 }).log10Rate;
		expect(down - up77).toBeCloseTo(0.12 / (8.617333262e-5 * 77 * Math.LN10), 9);
	});
	// The ruler has no temperature in it (Page et al. 1999, eq. 1): only the uphill term moves.
	it('gives a downhill rate that does not depend on temperature', () => {
		const at = (t: number) =>
			moserDuttonLog10Rate({ edgeDistanceA: 9, deltaGEv: -0.2, lambdaEv: 0.7, temperatureK: t });
		expect(at(77).log10Rate).toBe(at(298.15).log10Rate);
		expect(at(400).log10Rate).toBe(at(298.15).log10Rate);
		expect(at(77).warnings.join()).toMatch(/no temperature in it/);
		expect(at(298.15).warnings).toEqual([]);
	});
	it('is continuous at ΔG° = 0', () => {
		const base = { edgeDistanceA: 9, lambdaEv: 0.7 };
		expect(moserDuttonLog10Rate({ ...base, deltaGEv: 1e-9 }).log10Rate).toBeCloseTo(
			moserDuttonLog10Rate({ ...base, deltaGEv: -1e-9 }).log10Rate,
			6
		);
	});
	it('warns below contact and beyond 14 Å, and for λ outside the usual range', () => {
		expect(
			moserDuttonRate({ edgeDistanceA: 2, deltaGEv: -0.1, lambdaEv: 0.7 }).warnings.join()
		).toMatch(/contact/);
		expect(
			moserDuttonRate({ edgeDistanceA: 18, deltaGEv: -0.1, lambdaEv: 0.7 }).warnings.join()
		).toMatch(/14 Å/);
		expect(
			moserDuttonRate({ edgeDistanceA: 8, deltaGEv: -0.1, lambdaEv: 2.5 }).warnings.join()
		).toMatch(/λ/);
		expect(moserDuttonRate({ edgeDistanceA: 8, deltaGEv: -0.1, lambdaEv: 0.7 }).warnings).toEqual(
			[]
		);
	});
	it('rejects λ ≤ 0 and ρ > 1', () => {
		expect(() => moserDuttonRate({ edgeDistanceA: 8, deltaGEv: 0, lambdaEv: 0 })).toThrow(
			RangeError
		);
		expect(() =>
			moserDuttonRate({ edgeDistanceA: 8, deltaGEv: 0, lambdaEv: 0.7, packingDensity: 1.2 })
		).toThrow(RangeError);
	});
	it('never returns NaN or Infinity', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 100, noNaN: true }),
				fc.double({ min: -5, max: 5, noNaN: true }),
				fc.double({ min: 0.01, max: 5, noNaN: true }),
				(r, dg, l) => {
					const x = moserDuttonRate({ edgeDistanceA: r, deltaGEv: dg, lambdaEv: l });
					expect(Number.isFinite(x.rate)).toBe(true);
					expect(Number.isFinite(x.log10Rate)).toBe(true);
				}
			)
		);
	});
});

describe('nonadiabatic Marcus rate', () => {
	// Marcus & Sutin, BBA 811, 265 (1985), eq. 26, evaluated independently with ħ = 6.582119569e-16 eV s
	// and k_B = 8.617333262e-5 eV/K (CODATA 2018): H = 0.01 eV, λ = 1 eV, ΔG° = −1 eV, 298.15 K.
	it('matches a hand evaluation at the activationless point', () => {
		const kT = 8.617333262e-5 * 298.15;
		const expected = (((2 * Math.PI) / 6.582119569e-16) * 1e-4) / Math.sqrt(4 * Math.PI * 1 * kT);
		expect(
			marcusRate({ couplingEv: 0.01, deltaGEv: -1, lambdaEv: 1, temperatureK: 298.15 }).rate /
				expected
		).toBeCloseTo(1, 9);
		expect(expected).toBeCloseTo(1.68e12, -10);
	});
	// Marcus theory: the rate is maximal at −ΔG° = λ and falls again beyond it (inverted region).
	it('peaks at −ΔG° = λ', () => {
		const k = (dg: number) =>
			marcusRate({ couplingEv: 0.001, deltaGEv: dg, lambdaEv: 0.8 }).log10Rate;
		expect(k(-0.8)).toBeGreaterThan(k(-0.79));
		expect(k(-0.8)).toBeGreaterThan(k(-0.81));
		expect(k(-0.6)).toBeCloseTo(k(-1.0), 9);
	});
	// Detailed balance: k(ΔG°)/k(−ΔG°) = exp(−ΔG°/k_BT), exactly, for the Marcus expression.
	it('obeys detailed balance', () => {
		fc.assert(
			fc.property(
				fc.double({ min: -0.5, max: 0.5, noNaN: true }),
				fc.double({ min: 0.2, max: 1.5, noNaN: true }),
				(dg, l) => {
					const f = marcusRate({ couplingEv: 0.001, deltaGEv: dg, lambdaEv: l }).log10Rate;
					const b = marcusRate({ couplingEv: 0.001, deltaGEv: -dg, lambdaEv: l }).log10Rate;
					const expected = -dg / (BOLTZMANN_EV_PER_K * 298.15) / Math.LN10;
					expect(Math.abs(f - b - expected)).toBeLessThan(1e-9);
				}
			)
		);
	});
	it('warns when coupling approaches k_BT (adiabatic regime)', () =>
		expect(marcusRate({ couplingEv: 0.05, deltaGEv: -0.5, lambdaEv: 0.8 }).warnings.join()).toMatch(
			/adiabatic/
		));
	it('scales with the square of the coupling', () => {
		const k = (h: number) => marcusRate({ couplingEv: h, deltaGEv: -0.3, lambdaEv: 0.8 }).rate;
		expect(k(0.002) / k(0.001)).toBeCloseTo(4, 9);
	});
	it('refuses a coupling of zero or less (log10 k would be −∞)', () =>
		expect(() => marcusRate({ couplingEv: 0, deltaGEv: 0, lambdaEv: 1 })).toThrow(RangeError));
});

describe('couplings, driving forces and reverse rates', () => {
	it('coupling decays as exp(−β(R − R₀)/2)', () => {
		expect(couplingAtDistance({ h0Ev: 0.02, betaPerA: 1.4, distanceA: 3.6 })).toBeCloseTo(0.02, 12);
		expect(couplingAtDistance({ h0Ev: 0.02, betaPerA: 1.4, r0A: 3.6, distanceA: 4.6 })).toBeCloseTo(
			0.02 * Math.exp(-0.7),
			12
		);
	});
	it('ΔG° from potentials: downhill when the acceptor is more positive', () => {
		expect(deltaGFromPotentials(-400, -250)).toBeCloseTo(-0.15, 12);
		expect(deltaGFromPotentials(-400, -250, 2)).toBeCloseTo(-0.3, 12);
	});
	// Detailed balance: k_b = k_f exp(ΔG°/k_BT); at 298.15 K, 59.16 meV is one decade.
	it('reverse rate by detailed balance', () => {
		expect(reverseRate(1e6, 0)).toBe(1e6);
		expect(reverseRate(1e6, (-0.0591596 * Math.log(10)) / Math.LN10, 298.15)).toBeCloseTo(1e5, -1);
	});
	// k_B·T·ln 10 at 298.15 K with k_B = 1.380649e-23 J/K and e = 1.602176634e-19 C (CODATA 2018,
	// exact): 0.0591593 eV, so 0.1 eV is 1.69035 decades.
	it('detailedBalanceDecades is |ΔG°|/(k_B T ln 10)', () => {
		const kTln10 = ((1.380649e-23 * 298.15) / 1.602176634e-19) * Math.log(10);
		expect(kTln10).toBeCloseTo(0.0591593, 7);
		expect(detailedBalanceDecades(0.1, 298.15)).toBeCloseTo(0.1 / kTln10, 12);
		expect(detailedBalanceDecades(-0.1, 298.15)).toBeCloseTo(0.1 / kTln10, 12);
		expect(() => detailedBalanceDecades(0.1, 0)).toThrow(RangeError);
	});
});

describe('hopRatePair: both directions of a hop, one uphill rule', () => {
	const coupling = { h0Ev: 0.01, betaPerA: 1.4 };
	// The Marcus expression (Marcus & Sutin 1985, eq. 26) obeys detailed balance by itself, so the
	// pair's uphill rate must equal marcusRate evaluated uphill.
	it('Marcus: the uphill rate equals the Marcus expression evaluated uphill', () => {
		for (const t of [77, 298.15, 400]) {
			const pair = hopRatePair({
				model: 'marcus',
				edgeDistanceA: 8,
				deltaGEv: 0.15,
				lambdaEv: 0.8,
				temperatureK: t,
				coupling
			});
			const direct = marcusRate({
				couplingEv: couplingAtDistance({ ...coupling, distanceA: 8 }),
				deltaGEv: 0.15,
				lambdaEv: 0.8,
				temperatureK: t
			});
			expect(pair.log10Forward).toBeCloseTo(direct.log10Rate, 9);
		}
	});
	it('Moser–Dutton: both directions are the ruler at ±ΔG° and the stated T', () => {
		const pair = hopRatePair({
			model: 'moser-dutton',
			edgeDistanceA: 10,
			deltaGEv: -0.1,
			lambdaEv: 0.7,
			temperatureK: 350
		});
		const ruler = (dg: number) =>
			moserDuttonLog10Rate({ edgeDistanceA: 10, deltaGEv: dg, lambdaEv: 0.7, temperatureK: 350 });
		expect(pair.log10Forward).toBe(ruler(-0.1).log10Rate);
		expect(pair.log10Backward).toBeCloseTo(ruler(0.1).log10Rate, 12);
		expect(pair.log10Forward - pair.log10Backward).toBeCloseTo(
			detailedBalanceDecades(0.1, 350),
			12
		);
	});
	it('refuses a Marcus hop without its coupling', () =>
		expect(() =>
			hopRatePair({ model: 'marcus', edgeDistanceA: 8, deltaGEv: 0, lambdaEv: 0.8 })
		).toThrow(TypeError));
});
