import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
	BOLTZMANN_EV_PER_K,
	analyseChain,
	monteCarloChain,
	moserDuttonRate,
	normalUpperTail,
	type ChainInput,
	type ChainResult
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

/** The transit time of a chain that is not blocked. */
function tau(r: ChainResult): number {
	if (r.meanTransitTimeS === null) throw new Error('the chain is blocked');
	return r.meanTransitTimeS;
}

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
			expect(tau(r) / expected).toBeCloseTo(1, 8);
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
		expect(tau(b)).toBeGreaterThanOrEqual(tau(a));
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
		expect(tau(r) / expected).toBeCloseTo(1, 8);
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
			expect(mc.meanTransitTimeS[p]! / tau(exact)).toBeCloseTo(1, 9);
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
			expect(tau(r) / ((f0 + f1 + b0) / (f0 * f1))).toBeCloseTo(1, 9);
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
		expect(tau(b) / (tau(a) + extra)).toBeCloseTo(1, 9);
		expect(b.sensitivities[3]!.value).toBeCloseTo(0, 6);
		const expected = analyticSensitivities(up, down);
		// The main hops' shares change by the branch: t_1 and t_2 grow with π_S.
		const terms = expected.map((s) => s * tau(a));
		terms[1]! += piS / (up[1]! * pi[1]!);
		terms[2]! += piS / (up[2]! * pi[2]!);
		terms.forEach((t, k) => expect(b.sensitivities[k]!.value).toBeCloseTo(t / tau(b), 6));
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

/** ln(Σ eˣ) of a list, without overflow. */
function logSumExp(xs: number[]): number {
	const top = Math.max(...xs);
	return top + Math.log(xs.reduce((s, x) => s + Math.exp(x - top), 0));
}

/**
 * Gardiner's birth–death first-passage time (§7.4, as birthDeathMfpt above) evaluated in
 * logarithms, for chains whose rates and weights are beyond double range: ln τ from ln f, ln b.
 */
function birthDeathLnMfpt(lnUp: number[], lnDown: number[]): number {
	const lnPi = [0];
	for (let k = 1; k < lnUp.length; k++) lnPi.push(lnPi[k - 1]! + lnUp[k - 1]! - lnDown[k - 1]!);
	const terms = lnUp.map((lnF, k) => logSumExp(lnPi.slice(0, k + 1)) - lnF - lnPi[k]!);
	return logSumExp(terms);
}

const kT = (t: number) => BOLTZMANN_EV_PER_K * t;

describe('potential range and rates beyond double range', () => {
	it('refuses a potential outside ±2 V vs SHE (30 000 mV for 30 mV)', () => {
		expect(() => analyseChain(linear([-300, 30_000, -200], [9, 9]))).toThrow(/outside ±2000 mV/);
		expect(() => analyseChain(linear([-2001, -200], [9]))).toThrow(RangeError);
		expect(analyseChain(linear([-2000, 2000], [9])).blocked).toBe(false);
	});

	/*
	 * A dead-end side centre S on the entry A of a single hop A → B adds its equilibrium weight:
	 * τ = (1 + π_S/π_A) / f_AB, with π_S/π_A = exp((Em_S − Em_A)/k_BT) by detailed balance,
	 * whatever the rates into and out of S (Gardiner §7.4, the branch formula above). With λ =
	 * 0.02 eV both of S's rates fall below 10⁻³⁰⁰ s⁻¹ (the inverted region), and the old solver
	 * dropped S as unreachable: a 10³⁷-fold too short transit, silently.
	 */
	function trapped(emS: number, temperatureK: number): ChainInput {
		return {
			centres: [
				{ id: 'A', emMv: -1000 },
				{ id: 'B', emMv: -950 },
				{ id: 'S', emMv: emS }
			],
			hops: [
				{ from: 'A', to: 'B', edgeDistanceA: 8 },
				{ from: 'A', to: 'S', edgeDistanceA: 10 }
			],
			entry: 'A',
			exit: 'B',
			lambdaEv: 0.02,
			temperatureK,
			model: 'moser-dutton'
		};
	}
	const expectedLn = (input: ChainInput) => {
		const fAB = moserDuttonRate({ edgeDistanceA: 8, deltaGEv: -0.05, lambdaEv: 0.02 }).log10Rate;
		const x = (input.centres[2]!.emMv - input.centres[0]!.emMv) / 1000 / kT(input.temperatureK!);
		return logSumExp([0, x]) - fAB * Math.LN10;
	};
	it('keeps a trap whose rates underflow, and finds its transit time (closed form)', () => {
		const input = trapped(1000, 298.15);
		const r = analyseChain(input);
		const side = r.hops[1]!;
		expect(side.log10ForwardRate).toBeLessThan(-300);
		expect(side.forwardRate).toBe(0);
		expect(r.blocked).toBe(false);
		expect(r.log10MeanTransitTimeS * Math.LN10).toBeCloseTo(expectedLn(input), 9);
		// Without S the transit would take 1/f_AB ≈ 10⁻¹⁰ s; the trap holds it for ~10²³ s.
		expect(r.log10MeanTransitTimeS).toBeGreaterThan(20);
		expect(r.warnings.join(' ')).toMatch(/below 10⁻³⁰⁰ s⁻¹ \(A ⇄ S\)/);
	});
	it('reports a chain blocked beyond 10³⁰⁰ s as blocked, with its logarithm (closed form)', () => {
		const input = trapped(1900, 40);
		const r = analyseChain(input);
		expect(r.blocked).toBe(true);
		expect(r.throughputPerS).toBe(0);
		expect(r.meanTransitTimeS).toBeNull();
		expect((r.log10MeanTransitTimeS * Math.LN10) / expectedLn(input)).toBeCloseTo(1, 10);
		expect(r.warnings.join(' ')).toMatch(/blocked/);
	});
	it('solves a linear chain with rates of 10⁻⁶⁰⁰ s⁻¹ as the log-space birth–death formula does', () => {
		const input = { ...linear([-1900, 1900, -1500, 1800], [9, 12, 8]), temperatureK: 30 };
		const r = analyseChain(input);
		expect(Math.min(...r.hops.map((h) => h.log10BackwardRate))).toBeLessThan(-600);
		const expected = birthDeathLnMfpt(
			r.hops.map((h) => h.log10ForwardRate * Math.LN10),
			r.hops.map((h) => h.log10BackwardRate * Math.LN10)
		);
		expect((r.log10MeanTransitTimeS * Math.LN10) / expected).toBeCloseTo(1, 10);
	});
	it('never says "no chain of hops joins them" for a connected network, whatever its rates', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -2000, max: 2000 }), { minLength: 2, maxLength: 9 }),
				fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 6 }),
				fc.double({ min: 4, max: 100, noNaN: true }),
				fc.double({ min: 5, max: 1000, noNaN: true }),
				fc.double({ min: 0.02, max: 2, noNaN: true }),
				fc.constantFrom('moser-dutton' as const, 'marcus' as const),
				(ems, extra, d, t, lambda, model) => {
					// A random tree (each centre joined to an earlier one), plus extra edges (loops).
					const hops = ems.slice(1).map((_, i) => ({
						from: `C${(i * 7919) % (i + 1)}`,
						to: `C${i + 1}`,
						edgeDistanceA: d
					}));
					for (const [a, b] of extra) {
						const [x, y] = [a % ems.length, b % ems.length];
						if (x !== y) hops.push({ from: `C${x}`, to: `C${y}`, edgeDistanceA: 6 });
					}
					const r = analyseChain({
						...linear(ems, []),
						hops,
						temperatureK: t,
						lambdaEv: lambda,
						model
					});
					expect(Number.isFinite(r.log10MeanTransitTimeS)).toBe(true);
					expect(r.blocked).toBe(r.log10MeanTransitTimeS > 300);
					if (r.blocked) expect(r.throughputPerS).toBe(0);
					else expect(r.throughputPerS * tau(r)).toBeCloseTo(1, 12);
				}
			),
			{ numRuns: 300 }
		);
	});
});

describe('detailed balance', () => {
	it('each hop: ln(k_f / k_b) = −ΔG°/k_BT at the stated temperature, even below 10⁻³⁰⁰ s⁻¹', () => {
		for (const t of [40, 200, 298.15, 350])
			for (const model of ['moser-dutton', 'marcus'] as const) {
				const r = analyseChain({
					...linear([-1800, -200, 1500, 300], [7, 12, 9], model),
					temperatureK: t
				});
				for (const h of r.hops) {
					const lnRatio = (h.log10ForwardRate - h.log10BackwardRate) * Math.LN10;
					expect(lnRatio / (-h.deltaGEv / kT(t))).toBeCloseTo(1, 12);
				}
			}
	});
	/*
	 * Independent of how the rates were built: the stationary distribution of the closed network
	 * (no exit) must be Boltzmann's, π_i ∝ exp(e·Em_i / k_BT) for an electron of energy −e·Em_i,
	 * with no net flux around the loop. Found as the null vector of the generator by ml-matrix's
	 * eigen-decomposition (a JAMA port: unrelated code).
	 */
	it('the closed network relaxes to the Boltzmann distribution (eigenvector of the generator)', () => {
		const ems = [-380, -300, -340, -250, -200];
		const input = linear(ems, [7, 12, 9, 10]);
		input.hops.push(
			{ from: 'C1', to: 'C3', edgeDistanceA: 11 },
			{ from: 'C0', to: 'C4', edgeDistanceA: 13 }
		);
		const t = 310;
		const r = analyseChain({ ...input, temperatureK: t });
		const n = ems.length;
		const q = Matrix.zeros(n, n);
		for (const h of r.hops) {
			const [i, j] = [Number(h.from.slice(1)), Number(h.to.slice(1))];
			q.set(i, j, q.get(i, j) + h.forwardRate);
			q.set(j, i, q.get(j, i) + h.backwardRate);
		}
		for (let i = 0; i < n; i++) {
			let out = 0;
			for (let j = 0; j < n; j++) if (j !== i) out += q.get(i, j);
			q.set(i, i, -out);
		}
		// π Q = 0: the eigenvector of Qᵀ whose eigenvalue is 0 (the one of smallest magnitude).
		const eig = new EigenvalueDecomposition(q.transpose());
		const values = eig.realEigenvalues;
		const zero = values.indexOf(values.reduce((a, b) => (Math.abs(b) < Math.abs(a) ? b : a)));
		const v = eig.eigenvectorMatrix.getColumn(zero);
		const total = v.reduce((a, b) => a + b, 0);
		const boltzmann = ems.map((em) => Math.exp(em / 1000 / kT(t)));
		const z = boltzmann.reduce((a, b) => a + b, 0);
		v.forEach((x, i) => expect(x / total / (boltzmann[i]! / z)).toBeCloseTo(1, 8));
	});
});

describe('first-passage times by an independent eigen-decomposition', () => {
	/*
	 * τ = e_entryᵀ (−Q_T)⁻¹ 1 (van Kampen §XII.2), Q_T the generator on the states other than the
	 * exit. Detailed balance makes D^½ (−Q_T) D^−½ symmetric (D = diag π, π Boltzmann's weights),
	 * so (−Q_T)⁻¹ = D^−½ V Λ⁻¹ Vᵀ D^½ from its symmetric eigen-decomposition S = V Λ Vᵀ, done by
	 * ml-matrix — no state reduction involved. Used for networks with branches and loops, where no
	 * closed form exists, and for the three-site chain worked by hand above.
	 */
	function eigenMfpt(input: ChainInput, r: ChainResult): number {
		const ids = input.centres.map((c) => c.id).filter((id) => id !== input.exit);
		const at = new Map(ids.map((id, i) => [id, i]));
		const n = ids.length;
		const t = input.temperatureK ?? 298.15;
		const em = new Map(input.centres.map((c) => [c.id, c.emMv]));
		const a = Matrix.zeros(n, n); // −Q_T
		for (const h of r.hops) {
			for (const [src, dst, k] of [
				[h.from, h.to, h.forwardRate],
				[h.to, h.from, h.backwardRate]
			] as const) {
				const i = at.get(src);
				if (i === undefined) continue;
				a.set(i, i, a.get(i, i) + k);
				const j = at.get(dst);
				if (j !== undefined) a.set(i, j, a.get(i, j) - k);
			}
		}
		const sqrtPi = ids.map((id) => Math.exp(em.get(id)! / 1000 / kT(t) / 2));
		const s = Matrix.zeros(n, n);
		for (let i = 0; i < n; i++)
			for (let j = 0; j < n; j++) s.set(i, j, (sqrtPi[i]! * a.get(i, j)) / sqrtPi[j]!);
		const eig = new EigenvalueDecomposition(s, { assumeSymmetric: true });
		const v = eig.eigenvectorMatrix;
		const lambda = eig.realEigenvalues;
		const e = at.get(input.entry)!;
		let total = 0;
		for (let j = 0; j < n; j++) {
			let g = 0;
			for (let m = 0; m < n; m++) g += (v.get(e, m) * v.get(j, m)) / lambda[m]!;
			total += (g * sqrtPi[j]!) / sqrtPi[e]!;
		}
		return total;
	}

	it('three sites: the eigen-decomposition and the hand-worked τ = (f₀ + f₁ + b₀)/(f₀f₁) agree with analyseChain', () => {
		const input = linear([-300, -240, -330], [8, 11]);
		const r = analyseChain(input);
		const [f0, f1] = r.hops.map((h) => h.forwardRate) as [number, number];
		const b0 = r.hops[0]!.backwardRate;
		expect(eigenMfpt(input, r) / ((f0 + f1 + b0) / (f0 * f1))).toBeCloseTo(1, 9);
		expect(tau(r) / eigenMfpt(input, r)).toBeCloseTo(1, 9);
	});
	it('a branched network with a loop and a dead end, both models', () => {
		for (const model of ['moser-dutton', 'marcus'] as const) {
			const input = linear([-380, -300, -340, -250, -200], [7, 12, 9, 10], model);
			input.centres.push({ id: 'S', emMv: -330 }, { id: 'D', emMv: -360 });
			input.hops.push(
				{ from: 'C2', to: 'S', edgeDistanceA: 8 },
				{ from: 'S', to: 'C4', edgeDistanceA: 11 },
				{ from: 'C1', to: 'D', edgeDistanceA: 9 }
			);
			const r = analyseChain(input);
			expect(tau(r) / eigenMfpt(input, r)).toBeCloseTo(1, 9);
		}
	});
	it('an exit in the middle: the centres beyond it are never visited', () => {
		const input = { ...linear([-380, -300, -340, -250, -200], [7, 12, 9, 10]), exit: 'C2' };
		const r = analyseChain(input);
		expect(r.visited.sort()).toEqual(['C0', 'C1']);
		const short = analyseChain(linear([-380, -300, -340], [7, 12]));
		expect(tau(r) / tau(short)).toBeCloseTo(1, 12);
	});
});

describe('Monte Carlo: blocked samples, truncation, fixed values', () => {
	/*
	 * The trap above at 40 K: the transit time crosses 10³⁰⁰ s when Em_S passes
	 * Em* = Em_A + k_BT·ln(10³⁰⁰·f_AB) (closed form, from τ = (1 + π_S/π_A)/f_AB). With Em_S
	 * drawn from N(μ, σ²), the fraction of blocked samples is Q((Em* − μ)/σ).
	 */
	it('counts blocked samples, reports their fraction, and keeps them in the percentiles', () => {
		const fAB = moserDuttonRate({ edgeDistanceA: 8, deltaGEv: -0.05, lambdaEv: 0.7 }).log10Rate;
		const t = 40;
		const threshold = -1000 + 1000 * kT(t) * Math.LN10 * (300 + fAB);
		const sigma = 40;
		const mu = threshold + 0.25 * sigma;
		const input: ChainInput = {
			centres: [
				{ id: 'A', emMv: -1000 },
				{ id: 'B', emMv: -950 },
				{ id: 'S', emMv: mu, emSigmaMv: sigma }
			],
			hops: [
				{ from: 'A', to: 'B', edgeDistanceA: 8 },
				{ from: 'A', to: 'S', edgeDistanceA: 10 }
			],
			entry: 'A',
			exit: 'B',
			lambdaEv: 0.7,
			temperatureK: t,
			model: 'moser-dutton'
		};
		const mc = monteCarloChain(input, { samples: 2000, seed: 5 });
		const expected = normalUpperTail(-0.25);
		expect(mc.blockedFraction).toBe(mc.blocked / 2000);
		// Binomial standard error √(p(1 − p)/n) ≈ 0.011: within 4 of it.
		expect(Math.abs(mc.blockedFraction - expected)).toBeLessThan(0.045);
		expect(mc.throughputPerS.p5).toBe(0);
		expect(mc.throughputPerS.p95).toBeGreaterThan(0);
		expect(mc.meanTransitTimeS.p95).toBeNull();
		expect(mc.meanTransitTimeS.p5).not.toBeNull();
		expect(mc.fixedCentres).toEqual(['A', 'B']);
		expect(mc.fixedHops).toEqual([
			{ from: 'A', to: 'B' },
			{ from: 'A', to: 'S' }
		]);
	});
	/*
	 * Distances are drawn from a normal truncated to 0–100 Å: for 95 ± 10 Å, SciPy 1.17.1
	 * (scipy.stats.truncnorm.ppf(0.5)) puts the median at 91.031 Å, where clamping at 100 Å
	 * would leave it at 95 Å. The throughput of a single hop falls with distance, so its median
	 * is the rate at the median distance (Moser–Dutton: 0.592 decades per Å).
	 */
	it('draws distances from a truncated normal, not a clamped one (median against SciPy)', () => {
		const input: ChainInput = {
			...linear([-300, -250], []),
			hops: [{ from: 'C0', to: 'C1', edgeDistanceA: 95, edgeSigmaA: 10 }]
		};
		const mc = monteCarloChain(input, { samples: 20_000, seed: 11 });
		const atMedian = moserDuttonRate({
			edgeDistanceA: 91.03128824910456,
			deltaGEv: -0.05,
			lambdaEv: 0.7
		});
		// Sampling error of the median ≈ 0.08 Å ≈ 0.05 decades; clamping would be 2.4 decades off.
		expect(Math.abs(Math.log10(mc.throughputPerS.p50) - atMedian.log10Rate)).toBeLessThan(0.25);
		expect(mc.fixedCentres).toEqual(['C0', 'C1']);
		expect(mc.fixedHops).toEqual([]);
	});
	it('draws potentials within ±2 V however wide their uncertainty', () => {
		const input: ChainInput = {
			...linear([-1950, -1900], [8]),
			centres: [
				{ id: 'C0', emMv: -1950, emSigmaMv: 500 },
				{ id: 'C1', emMv: -1900 }
			]
		};
		// analyseChain refuses a potential beyond ±2 V: every sample solving shows none was drawn.
		const mc = monteCarloChain(input, { samples: 500, seed: 3 });
		expect(mc.blocked).toBe(0);
		expect(mc.throughputPerS.p5).toBeGreaterThan(0);
	});
});
