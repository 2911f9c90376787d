import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	fitNernst,
	nernstFractionReduced,
	seededRandom,
	type FitOptions,
	type NernstFit,
	type TitrationPoint,
	type TitrationResult
} from '$lib/science';

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
			(y, c) => y + c.amplitude * fractionReduced(e, c.emMv, c.n),
			offset
		);
		return { potentialMv: e, signal: clean + noise * random.normal() };
	});
}

function fitted(result: TitrationResult): NernstFit {
	if (result.outcome !== 'fitted') throw new Error(`expected a fit, got: ${result.message}`);
	return result;
}

const ssrOf = (fit: NernstFit) => fit.residuals.reduce((s, r) => s + r * r, 0);

/*
 * THE INDEPENDENT COMPUTATION used as the oracle for least-squares minima below. It shares no
 * code with the fit (no Levenberg–Marquardt, no Jacobian, no scaling, not even the library's
 * Nernst function):
 * - the Nernst equation written out with CODATA 2018 F and R (exact since the 2019 SI):
 *   fraction reduced x = 1 / (1 + exp[nF(E − Em)/RT]);
 * - for given Em and n of each component, the offset and amplitudes are linear, so the best of
 *   them is exact: linear least squares by the normal equations, solved by Gaussian elimination
 *   with partial pivoting ("the variable projection" view of separable least squares: G. H. Golub
 *   & V. Pereyra, SIAM J. Numer. Anal. 10, 413 (1973));
 * - an exhaustive grid over every Em (pairs, Em1 < Em2) across the measured range and n, then
 *   compass search from each of the eight best grid points that lie apart, halving the steps
 *   down to 1e-5 mV and 1e-7 in n (a derivative-free direct search: T. G. Kolda, R. M. Lewis & V. Torczon, SIAM Rev. 45, 385
 *   (2003), §3).
 */
const F = 96485.33212; // C/mol
const R = 8.314462618; // J/(mol K)
const T = 298.15;

function fractionReduced(eMv: number, emMv: number, n: number): number {
	return 1 / (1 + Math.exp((n * F * ((eMv - emMv) / 1000)) / (R * T)));
}

function solveLinear(a: number[][], b: number[]): number[] | null {
	const m = a.map((row, i) => [...row, b[i]!]);
	const n = b.length;
	for (let c = 0; c < n; c++) {
		let pivot = c;
		for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[pivot]![c]!)) pivot = r;
		if (Math.abs(m[pivot]![c]!) < 1e-300) return null;
		[m[c], m[pivot]] = [m[pivot]!, m[c]!];
		for (let r = c + 1; r < n; r++) {
			const f = m[r]![c]! / m[c]![c]!;
			for (let k = c; k <= n; k++) m[r]![k]! -= f * m[c]![k]!;
		}
	}
	const x = new Array<number>(n).fill(0);
	for (let r = n - 1; r >= 0; r--) {
		let s = m[r]![n]!;
		for (let k = r + 1; k < n; k++) s -= m[r]![k]! * x[k]!;
		x[r] = s / m[r]![r]!;
	}
	return x;
}

/** Sum of squares at the best offset and amplitudes for these Em and n (Infinity if singular). */
function projectedSsr(points: TitrationPoint[], ems: number[], ns: number[]): number {
	const q = ems.length + 1;
	const ata = Array.from({ length: q }, () => new Array<number>(q).fill(0));
	const aty = new Array<number>(q).fill(0);
	const row = new Array<number>(q).fill(1);
	for (const p of points) {
		for (let c = 0; c < ems.length; c++)
			row[c + 1] = fractionReduced(p.potentialMv, ems[c]!, ns[c]!);
		for (let i = 0; i < q; i++) {
			aty[i]! += row[i]! * p.signal;
			for (let j = 0; j < q; j++) ata[i]![j]! += row[i]! * row[j]!;
		}
	}
	const linear = solveLinear(ata, aty);
	if (!linear) return Infinity;
	// Evaluated point by point, not as yᵀy − βᵀAᵀy, which cancels badly near a good fit.
	let ssr = 0;
	for (const p of points) {
		let model = linear[0]!;
		for (let c = 0; c < ems.length; c++)
			model += linear[c + 1]! * fractionReduced(p.potentialMv, ems[c]!, ns[c]!);
		ssr += (p.signal - model) ** 2;
	}
	return ssr;
}

interface Reference {
	ems: number[];
	ns: number[];
	ssr: number;
}

/** Compass search over [Em…, n…] (n only when free, kept within 0.2–4) from `start`. */
function compass(
	points: TitrationPoint[],
	options: FitOptions,
	start: Reference,
	stepMv: number,
	stepN: number
): Reference {
	const count = options.components;
	const free = options.n === undefined;
	const split = (v: number[]) => ({
		ems: v.slice(0, count),
		ns: free ? v.slice(count) : Array.from({ length: count }, () => options.n!)
	});
	let v = [...start.ems, ...(free ? start.ns : [])];
	let best = start.ssr;
	const steps = v.map((_, i) => (i < count ? stepMv : stepN));
	while (steps[0]! > 1e-5) {
		let moved = false;
		for (let i = 0; i < v.length; i++) {
			for (const sign of [1, -1]) {
				const trial = [...v];
				trial[i] = trial[i]! + sign * steps[i]!;
				if (i >= count && (trial[i]! < 0.2 || trial[i]! > 4)) continue;
				const { ems, ns } = split(trial);
				const ssr = projectedSsr(points, ems, ns);
				if (ssr < best) {
					best = ssr;
					v = trial;
					moved = true;
					break;
				}
			}
		}
		if (!moved) for (let i = 0; i < steps.length; i++) steps[i] = steps[i]! / 2;
	}
	return { ...split(v), ssr: best };
}

function exhaustive(
	points: TitrationPoint[],
	options: FitOptions,
	emStepMv: number,
	nGrid: number[]
): Reference {
	const es = points.map((p) => p.potentialMv);
	const low = Math.min(...es);
	const high = Math.max(...es);
	const ems: number[] = [];
	for (let e = low; e <= high + 1e-9; e += emStepMv) ems.push(e);
	const emSets =
		options.components === 1
			? ems.map((e) => [e])
			: ems.flatMap((a, i) => ems.slice(i + 1).map((b) => [a, b]));
	const nSets =
		options.n !== undefined
			? [Array.from({ length: options.components }, () => options.n!)]
			: options.components === 1
				? nGrid.map((n) => [n])
				: nGrid.flatMap((a) => nGrid.map((b) => [a, b]));
	// The best grid points (each more than two grid steps from a better one) are all refined: a
	// coarse grid may hold the global minimum's basin only in its second or third best point.
	const grid: Reference[] = [];
	for (const e of emSets)
		for (const n of nSets) grid.push({ ems: e, ns: n, ssr: projectedSsr(points, e, n) });
	grid.sort((a, b) => a.ssr - b.ssr);
	const seeds: Reference[] = [];
	for (const g of grid) {
		if (seeds.length === 8) break;
		const near = seeds.some(
			(s) =>
				s.ems.every((em, i) => Math.abs(em - g.ems[i]!) <= 2 * emStepMv) &&
				s.ns.every((n, i) => Math.abs(n - g.ns[i]!) <= 0.5)
		);
		if (!near) seeds.push(g);
	}
	return seeds
		.map((s) => compass(points, options, s, emStepMv / 2, 0.05))
		.reduce((a, b) => (b.ssr < a.ssr ? b : a));
}

describe('fitNernst', () => {
	it('recovers a noiseless one-electron titration exactly', () => {
		const fit = fitted(
			fitNernst(synthetic([{ emMv: -275, n: 1, amplitude: 1 }]), { components: 1, n: 1 })
		);
		expect(fit.components[0]!.emMv).toBeCloseTo(-275, 4);
		expect(fit.components[0]!.amplitude).toBeCloseTo(1, 5);
		expect(fit.offset).toBeCloseTo(0.1, 5);
		expect(fit.rmsd).toBeLessThan(1e-6);
		expect(fit.components[0]!.nSe).toBeNull();
		expect(fit.warnings).toEqual([]);
	});
	it('fits n when it is not given', () => {
		const fit = fitted(
			fitNernst(synthetic([{ emMv: -200, n: 2, amplitude: -0.8 }], { noise: 0.005 }), {
				components: 1
			})
		);
		expect(fit.components[0]!.n).toBeCloseTo(2, 0);
		expect(fit.components[0]!.amplitude).toBeCloseTo(-0.8, 1);
	});
	it('separates two components 150 mV apart', () => {
		const fit = fitted(
			fitNernst(
				synthetic(
					[
						{ emMv: -380, n: 1, amplitude: 0.6 },
						{ emMv: -230, n: 1, amplitude: 0.4 }
					],
					{ noise: 0.004, count: 60 }
				),
				{ components: 2, n: 1 }
			)
		);
		expect(fit.components.map((c) => Math.round(c.emMv / 10) * 10)).toEqual([-380, -230]);
		expect(fit.warnings).toEqual([]);
		expect(fit.alternatives).toEqual([]);
	});
	it('recovers known parameters from noisy data within a few standard errors', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: -450, max: -100 }),
				fc.integer({ min: 1, max: 1_000_000 }),
				(em, seed) => {
					const fit = fitted(
						fitNernst(synthetic([{ emMv: em, n: 1, amplitude: 1 }], { noise: 0.02, seed }), {
							components: 1,
							n: 1
						})
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
	 * An external case: the data come from the Nernst equation written out above, not from the
	 * library's nernstFractionReduced. A worked point: at E − Em = (RT/F)·ln 10 = 59.159 mV (n = 1,
	 * 298.15 K) the ratio ox/red is 10, so x = 1/11 exactly.
	 */
	describe('on a titration written out from the Nernst equation (CODATA 2018 F and R)', () => {
		const titration = (emMv: number, n: number, amplitude: number, offset: number) =>
			Array.from({ length: 41 }, (_, i) => {
				const e = emMv - 200 + 10 * i;
				return { potentialMv: e, signal: offset + amplitude * fractionReduced(e, emMv, n) };
			});
		it('the worked point: ox/red = 10 at 59.159 mV above Em gives x = 1/11', () => {
			const slopeMv = ((R * T) / F) * Math.LN10 * 1000;
			expect(slopeMv).toBeCloseTo(59.159, 3);
			expect(fractionReduced(-250 + slopeMv, -250, 1)).toBeCloseTo(1 / 11, 12);
			expect(nernstFractionReduced(-250 + slopeMv, -250, 1)).toBeCloseTo(1 / 11, 10);
		});
		it('recovers Em, amplitude and offset of a one-electron centre (n fixed)', () => {
			const fit = fitted(fitNernst(titration(-345, 1, 0.72, 0.05), { components: 1, n: 1 }));
			expect(fit.components[0]!.emMv).toBeCloseTo(-345, 4);
			expect(fit.components[0]!.amplitude).toBeCloseTo(0.72, 5);
			expect(fit.offset).toBeCloseTo(0.05, 5);
			expect(fit.rmsd).toBeLessThan(1e-6);
		});
		it('recovers n = 2 when n is fitted (a two-electron flavin-like step)', () => {
			const fit = fitted(fitNernst(titration(-180, 2, -0.4, 0.9), { components: 1 }));
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
			const fit = fitted(
				fitNernst(synthetic([{ emMv: -300, n: 1, amplitude: 1 }], { noise: 0.03, seed }), {
					components: 1,
					n: 1
				})
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

/*
 * Issue 13: the same data in other units gave another Em (absolute damping in the old
 * Levenberg–Marquardt). Before the fix, over these scales and offsets, Em moved by up to 1 % of
 * itself (2.5 standard errors) for one component and 7 % (6.6 SE) for two.
 */
describe(
	'fitNernst is invariant to the units and offset of the signal and of the potentials',
	{ timeout: 30_000 },
	() => {
		const cases: [string, TitrationPoint[], FitOptions][] = [
			[
				'one component, n fixed',
				synthetic([{ emMv: -275, n: 1, amplitude: 1 }], { noise: 0.02, seed: 5 }),
				{ components: 1, n: 1 }
			],
			[
				'one component, n fitted',
				synthetic([{ emMv: -275, n: 1, amplitude: 1 }], { noise: 0.02, seed: 6 }),
				{ components: 1 }
			],
			[
				'two components, n fixed',
				synthetic(
					[
						{ emMv: -380, n: 1, amplitude: 0.6 },
						{ emMv: -230, n: 1, amplitude: 0.4 }
					],
					{ noise: 0.02, seed: 7, count: 60 }
				),
				{ components: 2, n: 1 }
			]
		];
		const close = (a: number, b: number) => Math.abs(a - b) <= 1e-6 * Math.abs(b);
		for (const [label, points, options] of cases) {
			it(`${label}: signal × 1e-6 … 1e6, offset 0 … 1e3 (in amplitude units)`, () => {
				const reference = fitted(fitNernst(points, options));
				for (const scale of [1e-6, 1e-3, 1e3, 1e6]) {
					for (const offset of [0, 1, 1e3]) {
						const fit = fitted(
							fitNernst(
								points.map((p) => ({
									potentialMv: p.potentialMv,
									signal: scale * (p.signal + offset)
								})),
								options
							)
						);
						fit.components.forEach((c, i) => {
							const r = reference.components[i]!;
							expect(close(c.emMv, r.emMv), `Em at ×${scale} +${offset}`).toBe(true);
							expect(close(c.emSeMv, r.emSeMv), `SE at ×${scale} +${offset}`).toBe(true);
							expect(close(c.amplitude, scale * r.amplitude)).toBe(true);
							if (r.nSe !== null) expect(close(c.nSe!, r.nSe)).toBe(true);
						});
						expect(close(fit.rmsd, scale * reference.rmsd)).toBe(true);
					}
				}
			});
			it(`${label}: potentials moved by −1000 … 1000 mV (another reference electrode)`, () => {
				const reference = fitted(fitNernst(points, options));
				for (const shift of [-1000, 197, 1000]) {
					const fit = fitted(
						fitNernst(
							points.map((p) => ({ potentialMv: p.potentialMv + shift, signal: p.signal })),
							options
						)
					);
					fit.components.forEach((c, i) => {
						const r = reference.components[i]!;
						expect(Math.abs(c.emMv - shift - r.emMv)).toBeLessThan(1e-6 * Math.abs(r.emMv));
						expect(close(c.emSeMv, r.emSeMv)).toBe(true);
					});
				}
			});
		}
		// Before the fix, at amplitude 1e-4 the fit stopped up to 2.8 SE from this minimum with a sum
		// of squares 26 % above it (50 seeds; 1.8 times it at amplitude 1e-6).
		it('at amplitude 1e-4 ends at the least-squares minimum of the independent computation', () => {
			for (let seed = 1; seed <= 20; seed++) {
				const points = synthetic([{ emMv: -275, n: 1, amplitude: 1e-4 }], {
					offset: 1e-5,
					noise: 2e-6,
					seed
				});
				const fit = fitted(fitNernst(points, { components: 1, n: 1 }));
				const reference = exhaustive(points, { components: 1, n: 1 }, 5, []);
				const c = fit.components[0]!;
				expect(Math.abs(c.emMv - reference.ems[0]!) / c.emSeMv).toBeLessThan(1e-3);
				expect(ssrOf(fit) / reference.ssr).toBeLessThan(1 + 1e-9);
			}
		});
	}
);

// The reference's exhaustive grids take seconds on a busy machine: a generous time-out, no timing.
describe(
	'fitNernst finds the least-squares optimum of the independent computation',
	{ timeout: 60_000 },
	() => {
		const nGrid = Array.from({ length: 12 }, (_, i) => 0.25 * (i + 1));
		const cases: [string, TitrationPoint[], FitOptions, number][] = [
			// A semiquinone-like bell (the signal of the middle state): one start ended far from it.
			[
				'a bell-shaped signal, two components, n fixed (seed 1)',
				synthetic(
					[
						{ emMv: -350, n: 1, amplitude: -1 },
						{ emMv: -150, n: 1, amplitude: 1 }
					],
					{ noise: 0.01, seed: 1, count: 60 }
				),
				{ components: 2, n: 1 },
				5
			],
			[
				'a bell-shaped signal, two components, n fixed (seed 3)',
				synthetic(
					[
						{ emMv: -350, n: 1, amplitude: -1 },
						{ emMv: -150, n: 1, amplitude: 1 }
					],
					{ noise: 0.01, seed: 3, count: 60 }
				),
				{ components: 2, n: 1 },
				5
			],
			[
				'a bell-shaped signal, two components, n fitted',
				synthetic(
					[
						{ emMv: -350, n: 1, amplitude: -1 },
						{ emMv: -150, n: 1, amplitude: 1 }
					],
					{ noise: 0.01, seed: 2, count: 30 }
				),
				{ components: 2 },
				20
			],
			[
				'two components of n = 2 and n = 1, n fitted',
				synthetic(
					[
						{ emMv: -380, n: 2, amplitude: 0.5 },
						{ emMv: -200, n: 1, amplitude: 0.5 }
					],
					{ noise: 0.01, seed: 1, count: 30 }
				),
				{ components: 2 },
				20
			],
			[
				'one component, n fitted (n = 0.5)',
				synthetic([{ emMv: -250, n: 0.5, amplitude: 1 }], { noise: 0.01, seed: 2 }),
				{ components: 1 },
				2
			]
		];
		for (const [label, points, options, emStep] of cases) {
			it(label, () => {
				const fit = fitted(fitNernst(points, options));
				const reference = exhaustive(points, options, emStep, nGrid);
				// The fit is at least as good as the reference, and the reference confirms it.
				expect(ssrOf(fit) / reference.ssr).toBeLessThan(1 + 1e-9);
				expect(reference.ssr / ssrOf(fit)).toBeLessThan(1 + 1e-7);
				fit.components.forEach((c, i) => {
					expect(Math.abs(c.emMv - reference.ems[i]!)).toBeLessThan(0.01 * c.emSeMv);
					expect(Math.abs(c.n - reference.ns[i]!)).toBeLessThan(1e-3);
				});
			});
		}

		it('reports other minima of similar fit quality (identifiability), each checked independently', () => {
			const points = synthetic(
				[
					{ emMv: -351, n: 0.5, amplitude: 0.41 },
					{ emMv: -305, n: 1, amplitude: 0.38 }
				],
				{ noise: 0.01, seed: 183, count: 30 }
			);
			const fit = fitted(fitNernst(points, { components: 2 }));
			expect(fit.alternatives.length).toBeGreaterThan(0);
			expect(fit.warnings.map((w) => w.code)).toContain('several_minima');
			expect(fit.warnings.find((w) => w.code === 'several_minima')!.message).toMatch(
				/do not single out one solution/
			);
			const best = exhaustive(points, { components: 2 }, 20, nGrid);
			expect(best.ssr / ssrOf(fit)).toBeLessThan(1 + 1e-7);
			const variance = best.ssr / (points.length - 7);
			for (const alternative of fit.alternatives) {
				const start = {
					ems: alternative.components.map((c) => c.emMv),
					ns: alternative.components.map((c) => c.n),
					ssr: projectedSsr(
						points,
						alternative.components.map((c) => c.emMv),
						alternative.components.map((c) => c.n)
					)
				};
				// A local minimum: compass search from it stays there.
				const local = compass(points, { components: 2 }, start, 1, 0.01);
				local.ems.forEach((em, i) => expect(Math.abs(em - start.ems[i]!)).toBeLessThan(0.5));
				expect(local.ssr / start.ssr).toBeGreaterThan(1 - 1e-6);
				// Of similar quality: within χ²₁(95 %) = 3.84 variances of the best.
				expect((start.ssr - best.ssr) / variance).toBeLessThan(3.85);
				// And distinct: more than a standard error from the best in some Em or n.
				const distinct = fit.components.some(
					(c, i) =>
						Math.abs(c.emMv - start.ems[i]!) > c.emSeMv || Math.abs(c.n - start.ns[i]!) > c.nSe!
				);
				expect(distinct).toBe(true);
			}
		});
	}
);

describe('fitNernst gives no Em where the data show no transition', { timeout: 30_000 }, () => {
	// The example: noise only gave "Em = −114 ± 701 mV".
	// Pure noise still gives an Em now and then: the fit searches Em over the whole range and keeps
	// the best-looking wiggle. Measured: 4 of 400 such runs (1 %) pass the 3-SE rule.
	it('noise only: no Em (at most 2 of 40 runs), mostly because the amplitude is within 3 SE of zero', () => {
		const codes: string[] = [];
		let withEm = 0;
		for (let seed = 1; seed <= 40; seed++) {
			const result = fitNernst(synthetic([], { noise: 0.02, seed }), { components: 1, n: 1 });
			if (result.outcome === 'fitted') {
				withEm++;
				continue;
			}
			expect(result.message).toMatch(/No Em is reported\.$/);
			expect(result).not.toHaveProperty('components');
			codes.push(...result.reasons.map((r) => r.code));
			if (result.reasons.some((r) => r.code === 'amplitude_not_significant'))
				expect(result.message).toMatch(
					/^No transition can be told apart from noise in these data \(the amplitude is \d\.\d standard errors from zero/
				);
		}
		expect(withEm).toBeLessThanOrEqual(2);
		expect(codes.filter((c) => c === 'amplitude_not_significant').length).toBeGreaterThan(20);
		expect(
			codes.every((c) => ['amplitude_not_significant', 'outside_range', 'degenerate'].includes(c))
		).toBe(true);
	});
	it('two components asked of data with one transition: says to fit one', () => {
		const result = fitNernst(
			synthetic([{ emMv: -300, n: 1, amplitude: 1 }], { noise: 0.02, seed: 4 }),
			{
				components: 2,
				n: 1
			}
		);
		expect(result.outcome).toBe('no_transition');
		if (result.outcome === 'no_transition')
			expect(result.message).toMatch(/do not determine two transitions.*fit one component/);
	});
	// Eight points, the transition at the top end of the range (measured, not made up).
	it('the standard error of Em exceeds the measured range', () => {
		const points = [
			[-370, 0.8725],
			[-284.3, 1.0567],
			[-198.6, 0.9317],
			[-112.9, 0.9929],
			[-27.1, 0.9894],
			[58.6, 1.0703],
			[144.3, 0.5868],
			[230, 0.329]
		].map(([potentialMv, signal]) => ({ potentialMv: potentialMv!, signal: signal! }));
		const result = fitNernst(points, { components: 1 });
		expect(result.outcome).toBe('no_transition');
		if (result.outcome !== 'no_transition') return;
		expect(result.reasons.map((r) => r.code)).toEqual(['em_undetermined']);
		expect(result.message).toMatch(/exceeds the width of the measured range \(600 mV\)/);
	});
	it('a transition outside the measured range', () => {
		const result = fitNernst(
			synthetic([{ emMv: -600, n: 1, amplitude: 1 }], { from: -300, to: 100, noise: 0.01 }),
			{ components: 1, n: 1 }
		);
		expect(result.outcome).toBe('no_transition');
		if (result.outcome === 'no_transition') {
			expect(result.reasons.map((r) => r.code)).toEqual(['outside_range']);
			expect(result.message).toMatch(/^No transition inside the measured range −300 mV to 100 mV/);
		}
	});
	it('never shows a standard error of Em wider than the range, nor one above the Nernst slope without a warning', () => {
		const slopeMv = ((R * T) / F) * Math.LN10 * 1000;
		fc.assert(
			fc.property(
				fc.integer({ min: 1, max: 1_000_000 }),
				fc.constantFrom(0, 0.02, 0.1, 0.5),
				fc.constantFrom(8, 15, 40),
				fc.constantFrom<FitOptions>({ components: 1, n: 1 }, { components: 1 }),
				(seed, amplitude, count, options) => {
					const points = synthetic([{ emMv: -300, n: 1, amplitude }], {
						noise: 0.05,
						seed,
						count,
						from: -800,
						to: 200
					});
					const result = fitNernst(points, options);
					if (result.outcome === 'no_transition') {
						expect(result.message).toMatch(/No Em is reported/);
						return;
					}
					for (const c of result.components) {
						expect(c.emSeMv).toBeLessThanOrEqual(1000);
						expect(Math.abs(c.amplitude) / c.amplitudeSe).toBeGreaterThanOrEqual(3);
						if (c.emSeMv > slopeMv)
							expect(result.warnings.map((w) => w.code)).toContain('large_em_error');
					}
				}
			),
			{ numRuns: 40 }
		);
	});
});

describe('fitNernst warns where a fitted number needs care', () => {
	// Ten points 111 mV apart and a steep step between two of them: Em is anywhere between them.
	it('a standard error of Em above the Nernst slope', () => {
		const random = seededRandom(104);
		const points = Array.from({ length: 10 }, (_, i) => {
			const e = -800 + (1000 * i) / 9;
			return { potentialMv: e, signal: fractionReduced(e, -300, 1) + 0.1 * random.normal() };
		});
		const fit = fitted(fitNernst(points, { components: 1 }));
		expect(fit.components[0]!.emSeMv).toBeGreaterThan(59.2);
		expect(fit.warnings.map((w) => w.code)).toContain('large_em_error');
		expect(fit.warnings[0]!.message).toMatch(
			/^The standard error of Em \(\d+ mV\) is larger than the Nernst slope \(59 mV/
		);
	});
	it('Em within a decade of ox/red of the end of the range', () => {
		const fit = fitted(
			fitNernst(
				synthetic([{ emMv: -275, n: 1, amplitude: 1 }], { from: -550, to: -250, noise: 0.005 }),
				{
					components: 1,
					n: 1
				}
			)
		);
		expect(fit.warnings.map((w) => w.code)).toEqual(['near_range_end']);
	});
	it('an apparent n at the limit of the fit', () => {
		const fit = fitted(
			fitNernst(synthetic([{ emMv: -275, n: 8, amplitude: 1 }], { noise: 0.002, count: 61 }), {
				components: 1
			})
		);
		expect(fit.components[0]!.n).toBe(4);
		expect(fit.warnings.map((w) => w.code)).toContain('n_at_limit');
	});
});
