import { describe, expect, it } from 'vitest';
import {
	normalCdf,
	normalQuantile,
	normalUpperTail,
	sampleTruncatedNormal,
	seededRandom,
	truncatedNormalMean,
	type RandomSource,
	type TruncatedNormal
} from '$lib/science';

/*
 * Oracles: values recorded from mpmath 1.3.0 at 40 significant digits (mpmath.ncdf for the tails;
 * mpmath.findroot on ncdf, or √2·erfinv(2p − 1), for the quantiles), and from SciPy 1.17.1
 * (scipy.stats.truncnorm: mean, var, ppf) for the truncated distributions — independent
 * implementations, recorded with Python 3.11.
 */

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('normal tails and quantiles', () => {
	// x → Q(x) = P(Z > x), mpmath.ncdf(−x).
	const TAILS: [number, number][] = [
		[-5, 0.9999997133484281],
		[-1, 0.8413447460685429],
		[0, 0.5],
		[0.5, 0.3085375387259869],
		[1.5, 0.06680720126885807],
		[1.6, 0.05479929169955798],
		[2, 0.02275013194817921],
		[3, 0.001349898031630095],
		[5, 2.866515718791939e-7],
		[10, 7.619853024160525e-24],
		[20, 2.7536241186062337e-89],
		[37, 5.725571222524577e-300]
	];
	it('upper tail to 2e-15 relative, far tails included (mpmath)', () => {
		for (const [x, q] of TAILS) expect(relative(normalUpperTail(x), q)).toBeLessThan(2e-15);
	});
	it('Φ(x) = Q(−x), with the lower tail as accurate as the upper', () => {
		for (const [x, q] of TAILS) expect(relative(normalCdf(-x), q)).toBeLessThan(2e-15);
	});
	// p → Φ⁻¹(p), mpmath.
	const QUANTILES: [number, number][] = [
		[1e-300, -37.0470962993612],
		[1e-20, -9.262340089798407],
		[1e-10, -6.361340902404057],
		[0.001, -3.090232306167814],
		[0.025, -1.959963984540054],
		[0.3, -0.5244005127080408],
		[0.975, 1.959963984540054],
		[0.999999, 4.753424308822899],
		[1 - 1e-10, 6.361340902404057]
	];
	it('quantiles to 1e-14 relative (Wichura AS 241 against mpmath)', () => {
		// 1 − 1e-10 is itself rounded to the nearest double: its quantile is good to ~1e-7 only.
		for (const [p, z] of QUANTILES)
			expect(relative(normalQuantile(p), z)).toBeLessThan(p > 0.9999 ? 1e-6 : 1e-14);
		expect(normalQuantile(0.5)).toBe(0);
	});
	it('refuses p outside (0, 1)', () => {
		for (const p of [0, 1, -0.1, 1.5]) expect(() => normalQuantile(p)).toThrow(RangeError);
		expect(() => normalQuantile(Number.NaN)).toThrow(TypeError);
	});
});

// (μ, σ, a, b) → mean, variance and 5 % quantile, from scipy.stats.truncnorm.
const CASES: [TruncatedNormal, number, number, number][] = [
	[
		{ mean: 1, sigma: 2, lower: 0, upper: 100 },
		2.018320867674067,
		1.9447017427854685,
		0.19202340192371348
	],
	[
		{ mean: 0, sigma: 1, lower: 0, upper: 40 },
		0.7978845608028654,
		0.3633802276324186,
		0.0627067779432137
	],
	[
		{ mean: 0, sigma: 1, lower: 2, upper: 3 },
		2.3158213267437806,
		0.0615207795744932,
		2.0202232033617347
	],
	[
		{ mean: 5, sigma: 1, lower: -10, upper: 0 },
		-0.1865039671258515,
		0.03269643461706184,
		-0.5494000506275318
	],
	[
		{ mean: 3, sigma: 4, lower: 0, upper: 100 },
		4.557528226943708,
		8.901521141442464,
		0.4915895180427281
	]
];

describe('truncatedNormalMean', () => {
	it('is the closed form of Johnson, Kotz & Balakrishnan (§10.1), as SciPy computes it', () => {
		for (const [d, mean] of CASES) expect(truncatedNormalMean(d)).toBeCloseTo(mean, 12);
	});
	it('is √(2/π) for the half-normal (an exact value)', () =>
		expect(truncatedNormalMean({ mean: 0, sigma: 1, lower: 0, upper: 40 })).toBeCloseTo(
			Math.sqrt(2 / Math.PI),
			14
		));
	it('refuses an empty interval and a point outside it', () => {
		expect(() => truncatedNormalMean({ mean: 0, sigma: 1, lower: 2, upper: 1 })).toThrow(
			RangeError
		);
		expect(() => truncatedNormalMean({ mean: 5, sigma: 0, lower: 0, upper: 1 })).toThrow(
			RangeError
		);
	});
});

/** A random source that hands out the given uniforms. */
const fixed = (u: number): RandomSource => ({ uniform: () => u, normal: () => 0 });

describe('sampleTruncatedNormal', () => {
	it('inverts the truncated distribution function: F(x(u)) = u to 1e-12', () => {
		for (const [d] of CASES) {
			const alpha = (d.lower - d.mean) / d.sigma;
			const beta = (d.upper - d.mean) / d.sigma;
			// F as a difference of whichever tail holds the interval (no cancellation), not the
			// route the sampler takes for the upper half.
			const below = beta <= 0;
			const tail = (z: number) => (below ? normalCdf(z) : normalUpperTail(z));
			const F = (x: number) => {
				const z = (x - d.mean) / d.sigma;
				return below
					? (tail(z) - tail(alpha)) / (tail(beta) - tail(alpha))
					: (tail(alpha) - tail(z)) / (tail(alpha) - tail(beta));
			};
			for (const u of [0, 1e-9, 0.01, 0.25, 0.5, 0.75, 0.99, 1 - 1e-9]) {
				const x = sampleTruncatedNormal(d, fixed(u));
				expect(x).toBeGreaterThanOrEqual(d.lower);
				expect(x).toBeLessThanOrEqual(d.upper);
				expect(Math.abs(F(x) - u)).toBeLessThan(1e-12);
			}
		}
	});
	it('puts the 5 % quantile where SciPy does', () => {
		for (const [d, , , q05] of CASES)
			expect(sampleTruncatedNormal(d, fixed(0.05))).toBeCloseTo(q05, 10);
	});
	it('has the closed-form mean: 100 000 draws within 4 standard errors (JKB §10.1)', () => {
		const random = seededRandom(2024);
		for (const [d, mean, variance] of CASES) {
			const n = 100_000;
			let sum = 0;
			let atBound = 0;
			for (let i = 0; i < n; i++) {
				const x = sampleTruncatedNormal(d, random);
				sum += x;
				if (x === d.lower || x === d.upper) atBound++;
			}
			expect(Math.abs(sum / n - mean)).toBeLessThan(4 * Math.sqrt(variance / n));
			// Clamping would pile Φ(α) of the draws on the bound (31 % for the first case).
			expect(atBound).toBeLessThan(3);
		}
	});
	it('with σ = 0 returns the mean and draws nothing', () => {
		const random = seededRandom(1);
		expect(sampleTruncatedNormal({ mean: 7, sigma: 0, lower: 0, upper: 100 }, random)).toBe(7);
		expect(random.uniform()).toBe(seededRandom(1).uniform());
	});
});
