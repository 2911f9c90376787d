import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	BOLTZMANN_EV_PER_K,
	analyseChain,
	monteCarloChain,
	moserDuttonRate,
	type ChainInput
} from '$lib/science';

const linear = (
	ems: number[],
	distances: number[],
	model: ChainInput['model'] = 'moser-dutton'
): ChainInput => ({
	centres: ems.map((emMv, i) => ({ id: `C${i}`, emMv })),
	hops: distances.map((edgeDistanceA, i) => ({ from: `C${i}`, to: `C${i + 1}`, edgeDistanceA })),
	entry: 'C0',
	exit: `C${ems.length - 1}`,
	lambdaEv: 0.7,
	temperatureK: 298.15,
	model
});

/**
 * Mean first-passage time of a one-step (birth–death) chain from state 0 to state N with N
 * absorbing: τ = Σ_{k=0}^{N−1} [1/(g_k π_k)] Σ_{j=0}^{k} π_j, π the detailed-balance weights.
 * C. W. Gardiner, Handbook of Stochastic Methods (3rd ed.), §7.4 (one-step processes), from memory.
 */
function birthDeathMfpt(up: number[], down: number[]): number {
	const pi = [1];
	for (let k = 1; k < up.length; k++) pi.push((pi[k - 1]! * up[k - 1]!) / down[k - 1]!);
	let tau = 0;
	let cumulative = 0;
	for (let k = 0; k < up.length; k++) {
		cumulative += pi[k]!;
		tau += cumulative / (up[k]! * pi[k]!);
	}
	return tau;
}

/** A four-centre chain, and the same chain with a dead-end side centre S hung on C1. */
function deadEndBranch(): { main: ChainInput; branched: ChainInput } {
	const main = linear([-350, -300, -250, -200], [9, 9, 9]);
	return {
		main,
		branched: {
			...main,
			centres: [...main.centres, { id: 'S', emMv: -320 }],
			hops: [...main.hops, { from: 'C1', to: 'S', edgeDistanceA: 8 }]
		}
	};
}

describe('analyseChain', () => {
	it('a single hop: the throughput is that hop’s rate', () => {
		const r = analyseChain(linear([-300, -250], [8]));
		const k = moserDuttonRate({ edgeDistanceA: 8, deltaGEv: -0.05, lambdaEv: 0.7 }).rate;
		expect(r.throughputPerS / k).toBeCloseTo(1, 9);
		expect(r.sensitivities[0]!.value).toBeCloseTo(1, 6);
	});
	it('uphill directions follow detailed balance at the given temperature', () => {
		const r = analyseChain({ ...linear([-300, -200, -350], [9, 11]), temperatureK: 310 });
		for (const h of r.hops) {
			expect(h.backwardRate / h.forwardRate).toBeCloseTo(
				Math.exp(h.deltaGEv / (BOLTZMANN_EV_PER_K * 310)),
				9
			);
		}
	});
	it('matches the birth–death first-passage formula on a linear chain (Gardiner §7.4)', () => {
		for (const model of ['moser-dutton', 'marcus'] as const) {
			const r = analyseChain(
				linear([-400, -300, -350, -200, -260, -100], [7, 11, 9.5, 12, 8], model)
			);
			const expected = birthDeathMfpt(
				r.hops.map((h) => h.forwardRate),
				r.hops.map((h) => h.backwardRate)
			);
			expect(r.meanTransitTimeS / expected).toBeCloseTo(1, 8);
		}
	});
	it('two parallel hops between the same pair add their rates', () => {
		const input = linear([-300, -250], [8]);
		input.hops.push({ from: 'C0', to: 'C1', edgeDistanceA: 10 });
		const r = analyseChain(input);
		expect(r.throughputPerS / (r.hops[0]!.forwardRate + r.hops[1]!.forwardRate)).toBeCloseTo(1, 9);
	});
	it('handles branches: a dead-end side branch slows transit only slightly, never speeds it', () => {
		const { main, branched } = deadEndBranch();
		const a = analyseChain(main);
		const b = analyseChain(branched);
		expect(b.meanTransitTimeS).toBeGreaterThanOrEqual(a.meanTransitTimeS);
		expect(b.sensitivities.find((s) => s.to === 'S')!.value).toBeLessThanOrEqual(0);
	});
	it('names the slowest step as rate-limiting', () => {
		const r = analyseChain(linear([-300, -290, -280, -270], [6, 16, 6]));
		expect(r.rateLimitingHop).toEqual({ from: 'C1', to: 'C2' });
		expect(r.sensitivities[1]!.value).toBeGreaterThan(0.9);
	});
	it('refuses a disconnected exit with a clear error', () => {
		const input = linear([-300, -250, -200], [8, 8]);
		input.hops = [input.hops[0]!];
		expect(() => analyseChain(input)).toThrow(/exit "C2" cannot be reached from entry "C0"/);
	});
	it('stays exact when hop rates span twenty decades (no cancellation)', () => {
		// A deep uphill step at long range next to fast downhill hops.
		const r = analyseChain(linear([278, 200, -477, -322, 0, 0], [6.7, 4, 15, 8.5, 12.6], 'marcus'));
		const expected = birthDeathMfpt(
			r.hops.map((h) => h.forwardRate),
			r.hops.map((h) => h.backwardRate)
		);
		expect(r.meanTransitTimeS / expected).toBeCloseTo(1, 8);
	});
	it('refuses unknown centres and entry = exit', () => {
		expect(() => analyseChain({ ...linear([-300, -250], [8]), exit: 'X' })).toThrow(/exit "X"/);
		expect(() => analyseChain({ ...linear([-300, -250], [8]), exit: 'C0' })).toThrow(/different/);
	});
	it('on a linear chain the throughput never exceeds the slowest forward hop', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -500, max: 300 }), { minLength: 2, maxLength: 8 }),
				fc.array(fc.double({ min: 4, max: 15, noNaN: true }), { minLength: 7, maxLength: 7 }),
				fc.constantFrom('moser-dutton' as const, 'marcus' as const),
				(ems, ds, model) => {
					const r = analyseChain(linear(ems, ds.slice(0, ems.length - 1), model));
					const slowest = Math.min(...r.hops.map((h) => h.forwardRate));
					expect(r.throughputPerS).toBeLessThanOrEqual(slowest * (1 + 1e-9));
				}
			),
			{ numRuns: 200 }
		);
	});
});

describe('monteCarloChain', () => {
	const input: ChainInput = {
		...linear([-350, -300, -250], [9, 10]),
		centres: [
			{ id: 'C0', emMv: -350, emSigmaMv: 20 },
			{ id: 'C1', emMv: -300, emSigmaMv: 20 },
			{ id: 'C2', emMv: -250, emSigmaMv: 20 }
		]
	};
	it('is reproducible for a seed', () => {
		expect(monteCarloChain(input, { samples: 200, seed: 7 })).toEqual(
			monteCarloChain(input, { samples: 200, seed: 7 })
		);
		expect(monteCarloChain(input, { samples: 200, seed: 7 })).not.toEqual(
			monteCarloChain(input, { samples: 200, seed: 8 })
		);
	});
	it('gives ordered percentiles around the deterministic throughput', () => {
		const mc = monteCarloChain(input, { samples: 2000, seed: 1 });
		const exact = analyseChain(input).throughputPerS;
		expect(mc.throughputPerS.p5).toBeLessThan(mc.throughputPerS.p50);
		expect(mc.throughputPerS.p50).toBeLessThan(mc.throughputPerS.p95);
		expect(mc.throughputPerS.p5).toBeLessThan(exact);
		expect(mc.throughputPerS.p95).toBeGreaterThan(exact);
	});
	it('with no uncertainty every percentile is the deterministic value', () => {
		const plain = linear([-350, -300, -250], [9, 10]);
		const mc = monteCarloChain(plain, { samples: 20, seed: 3 });
		const exact = analyseChain(plain);
		for (const p of ['p5', 'p50', 'p95'] as const) {
			expect(mc.throughputPerS[p] / exact.throughputPerS).toBeCloseTo(1, 9);
			expect(mc.meanTransitTimeS[p] / exact.meanTransitTimeS).toBeCloseTo(1, 9);
		}
		expect(mc.blocked).toBe(0);
	});
	it('refuses too few samples', () =>
		expect(() => monteCarloChain(input, { samples: 5, seed: 1 })).toThrow(RangeError));
});

describe('sensitivities', () => {
	/*
	 * Oracle: the analytic derivative of the birth–death first-passage time (Gardiner §7.4, above).
	 * On a linear chain τ = Σ_k t_k with t_k = (Σ_{j≤k} π_j) / (f_k π_k), where the weights
	 * π_{j+1} = π_j f_j / b_j depend only on the ratios f/b. Scaling both directions of hop i by s
	 * leaves every π unchanged and turns t_i into t_i / s, so
	 *   d ln(throughput) / d ln s_i = −d ln τ / d ln s_i = t_i / τ,
	 * the share of the transit time that hop i's term contributes. For three sites (two hops) in
	 * closed form: τ = (f₀ + f₁ + b₀) / (f₀ f₁), S₀ = f₁ / (f₀ + f₁ + b₀), S₁ = (f₀ + b₀) / (f₀ + f₁ + b₀).
	 */
	function analyticSensitivities(up: number[], down: number[]): number[] {
		const pi = [1];
		for (let k = 1; k < up.length; k++) pi.push((pi[k - 1]! * up[k - 1]!) / down[k - 1]!);
		let cumulative = 0;
		const terms = up.map((f, k) => {
			cumulative += pi[k]!;
			return cumulative / (f * pi[k]!);
		});
		const tau = terms.reduce((a, b) => a + b, 0);
		return terms.map((t) => t / tau);
	}

	it('match the closed form on a three-site chain', () => {
		for (const model of ['moser-dutton', 'marcus'] as const) {
			const r = analyseChain(linear([-300, -240, -330], [8, 11], model));
			const [f0, f1] = r.hops.map((h) => h.forwardRate) as [number, number];
			const b0 = r.hops[0]!.backwardRate;
			expect(r.meanTransitTimeS / ((f0 + f1 + b0) / (f0 * f1))).toBeCloseTo(1, 9);
			expect(r.sensitivities[0]!.value).toBeCloseTo(f1 / (f0 + f1 + b0), 6);
			expect(r.sensitivities[1]!.value).toBeCloseTo((f0 + b0) / (f0 + f1 + b0), 6);
		}
	});
	it('match the analytic derivative on a six-site chain, and sum to 1', () => {
		const r = analyseChain(linear([-320, -280, -300, -250, -270, -230], [9, 10, 9.5, 10.5, 9]));
		const expected = analyticSensitivities(
			r.hops.map((h) => h.forwardRate),
			r.hops.map((h) => h.backwardRate)
		);
		// Every hop carries a share worth checking (none is negligible).
		expect(Math.min(...expected)).toBeGreaterThan(0.01);
		r.sensitivities.forEach((s, k) => expect(s.value).toBeCloseTo(expected[k]!, 6));
		expect(r.sensitivities.reduce((a, s) => a + s.value, 0)).toBeCloseTo(1, 6);
	});
	/*
	 * A dead-end side state S hung on centre m of a linear chain only adds its equilibrium weight
	 * π_S = π_m g / r (g: m → S, r: S → m) to every cumulative sum from m on, so
	 * τ_branched = τ_linear + Σ_{k≥m} π_S / (f_k π_k), and scaling the side hop leaves τ unchanged:
	 * its sensitivity is exactly 0.
	 */
	it('are 0 for a dead-end side branch, whose extra transit time has a closed form', () => {
		const { main, branched } = deadEndBranch();
		const a = analyseChain(main);
		const b = analyseChain(branched);
		const up = a.hops.map((h) => h.forwardRate);
		const down = a.hops.map((h) => h.backwardRate);
		const pi = [1, up[0]! / down[0]!, (up[0]! * up[1]!) / (down[0]! * down[1]!)];
		const side = b.hops[3]!;
		const piS = (pi[1]! * side.forwardRate) / side.backwardRate;
		const extra = [1, 2].reduce((t, k) => t + piS / (up[k]! * pi[k]!), 0);
		expect(b.meanTransitTimeS / (a.meanTransitTimeS + extra)).toBeCloseTo(1, 9);
		expect(b.sensitivities[3]!.value).toBeCloseTo(0, 6);
		const expected = analyticSensitivities(up, down);
		// The main hops' shares change by the branch: t_1 and t_2 grow with π_S.
		const terms = expected.map((s) => s * a.meanTransitTimeS);
		terms[1]! += piS / (up[1]! * pi[1]!);
		terms[2]! += piS / (up[2]! * pi[2]!);
		terms.forEach((t, k) =>
			expect(b.sensitivities[k]!.value).toBeCloseTo(t / b.meanTransitTimeS, 6)
		);
	});
	// No closed form with a loop: a consistency check against moving each hop's distance (a
	// different route to the same rate scaling), not an independent oracle.
	it('on a network with a loop, agree with finite differences in the hop distances', () => {
		const input = linear([-380, -300, -340, -250, -200], [7, 12, 9, 10]);
		input.centres.push({ id: 'S', emMv: -330 });
		input.hops.push(
			{ from: 'C2', to: 'S', edgeDistanceA: 8 },
			{ from: 'S', to: 'C4', edgeDistanceA: 11 }
		);
		const r = analyseChain(input);
		r.hops.forEach((h, k) => {
			const scaled = (factor: number) => {
				// Scale this hop's rates by moving its distance: log10 k shifts by (1.2 − 0.8ρ)·Δd.
				const hops = input.hops.map((x, i) =>
					i === k ? { ...x, edgeDistanceA: x.edgeDistanceA - Math.log10(factor) / 0.592 } : x
				);
				return analyseChain({ ...input, hops }).throughputPerS;
			};
			const numeric = (Math.log(scaled(Math.exp(1e-4))) - Math.log(scaled(Math.exp(-1e-4)))) / 2e-4;
			expect(r.sensitivities[k]!.value).toBeCloseTo(numeric, 4);
		});
	});
});
