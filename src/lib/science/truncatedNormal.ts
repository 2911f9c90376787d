import { requireFinite, requireNonNegative } from './guards';
import type { RandomSource } from './random';

/*
 * The standard normal distribution's tails and quantiles, and the normal distribution truncated
 * to an interval: its mean in closed form and exact draws by inverting its distribution function.
 *
 * Why inversion: clamping a normal draw to the interval piles probability on the bound, and
 * redrawing until a value falls inside needs an unbounded loop (or biases the draw when the loop
 * is cut short). Inverting the truncated distribution function maps one uniform draw to one
 * value, exactly distributed, in constant time, however much of the normal lies outside.
 */

const SQRT_2PI = Math.sqrt(2 * Math.PI);

/** The standard normal density φ(x). */
export function normalDensity(x: number): number {
	return Math.exp(-0.5 * x * x) / SQRT_2PI;
}

/**
 * The upper tail of the standard normal, Q(x) = 1 − Φ(x) = P(Z > x), to about 1e-15 relative
 * accuracy over the whole line (it underflows to 0 beyond x ≈ 38.5).
 *
 * For |x| ≤ 1.5, Marsaglia's series Φ(x) = ½ + φ(x)(x + x³/3 + x⁵/(3·5) + …); beyond, Laplace's
 * continued fraction for the Mills ratio Q(x)/φ(x) = 1/(x + 1/(x + 2/(x + 3/(x + …)))), evaluated
 * by the modified Lentz method, so that far tails keep their relative accuracy.
 * References: G. Marsaglia, J. Stat. Softw. 11(4) (2004); M. Abramowitz & I. A. Stegun,
 * Handbook of Mathematical Functions (1964), 26.2.14 (the continued fraction); W. H. Press et al.,
 * Numerical Recipes (3rd ed., 2007), §5.2 (modified Lentz).
 * @throws {TypeError} for a non-finite x.
 * @example normalUpperTail(1.959963984540054) // ≈ 0.025
 */
export function normalUpperTail(x: number): number {
	requireFinite(x, 'x');
	if (x < -1.5) return 1 - normalUpperTail(-x);
	if (x <= 1.5) {
		const x2 = x * x;
		let term = x;
		let sum = x;
		// Terms fall below the sum's last bit within 60 steps for |x| ≤ 1.5.
		for (let i = 1; i < 200; i++) {
			term *= x2 / (2 * i + 1);
			const next = sum + term;
			if (next === sum) break;
			sum = next;
		}
		return 0.5 - normalDensity(x) * sum;
	}
	const tiny = 1e-300;
	let f = tiny;
	let c = f;
	let d = 0;
	// Converges in under 200 steps for x > 1.5; the bound only keeps the loop finite.
	for (let n = 1; n <= 2000; n++) {
		const a = n === 1 ? 1 : n - 1;
		d = x + a * d;
		if (d === 0) d = tiny;
		c = x + a / c;
		if (c === 0) c = tiny;
		d = 1 / d;
		const delta = c * d;
		f *= delta;
		if (Math.abs(delta - 1) < 1e-16) break;
	}
	return normalDensity(x) * f;
}

/** The standard normal distribution function Φ(x), accurate in relative terms in both tails. */
export function normalCdf(x: number): number {
	return normalUpperTail(-x);
}

/**
 * The standard normal quantile Φ⁻¹(p), 0 < p < 1, by Wichura's algorithm AS 241 (PPND16), good
 * to about 1e-16 relative: a rational function of p near the centre and of √(−ln min(p, 1−p)) in
 * the tails.
 * References: M. J. Wichura, Appl. Stat. 37, 477 (1988).
 * @throws {RangeError} for p outside (0, 1).
 * @example normalQuantile(0.975) // ≈ 1.959963984540054
 */
export function normalQuantile(p: number): number {
	requireFinite(p, 'p');
	if (!(p > 0 && p < 1)) throw new RangeError(`p must lie strictly between 0 and 1, got ${p}`);
	const q = p - 0.5;
	if (Math.abs(q) <= 0.425) {
		const r = 0.180625 - q * q;
		return (
			(q *
				(((((((2509.0809287301227 * r + 33430.57558358813) * r + 67265.7709270087) * r +
					45921.95393154987) *
					r +
					13731.69376550946) *
					r +
					1971.5909503065513) *
					r +
					133.14166789178438) *
					r +
					3.3871328727963665)) /
			(((((((5226.495278852854 * r + 28729.085735721943) * r + 39307.89580009271) * r +
				21213.794301586597) *
				r +
				5394.196021424751) *
				r +
				687.1870074920579) *
				r +
				42.31333070160091) *
				r +
				1)
		);
	}
	let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
	let x: number;
	if (r <= 5) {
		r -= 1.6;
		x =
			(((((((0.0007745450142783414 * r + 0.022723844989269184) * r + 0.2417807251774506) * r +
				1.2704582524523684) *
				r +
				3.6478483247632045) *
				r +
				5.769497221460691) *
				r +
				4.630337846156546) *
				r +
				1.4234371107496835) /
			(((((((1.0507500716444169e-9 * r + 0.0005475938084995345) * r + 0.015198666563616457) * r +
				0.14810397642748008) *
				r +
				0.6897673349851) *
				r +
				1.6763848301838038) *
				r +
				2.053191626637759) *
				r +
				1);
	} else {
		r -= 5;
		x =
			(((((((2.0103343992922881e-7 * r + 0.000027115555687434876) * r + 0.0012426609473880784) * r +
				0.026532189526576124) *
				r +
				0.29656057182850487) *
				r +
				1.7848265399172913) *
				r +
				5.463784911164114) *
				r +
				6.657904643501103) /
			(((((((2.0442631033899397e-15 * r + 1.421511758316446e-7) * r + 0.000018463183175100548) * r +
				0.0007868691311456133) *
				r +
				0.014875361290850615) *
				r +
				0.1369298809227358) *
				r +
				0.599832206555888) *
				r +
				1);
	}
	return q < 0 ? -x : x;
}

/** A normal distribution N(μ, σ²) truncated to [lower, upper]. */
export interface TruncatedNormal {
	mean: number;
	/** σ ≥ 0; 0 gives the point μ (which must then lie inside the interval). */
	sigma: number;
	lower: number;
	upper: number;
}

function checkTruncated({ mean, sigma, lower, upper }: TruncatedNormal): void {
	requireFinite(mean, 'mean');
	requireNonNegative(sigma, 'sigma');
	requireFinite(lower, 'lower');
	requireFinite(upper, 'upper');
	if (!(lower < upper)) throw new RangeError(`lower (${lower}) must be below upper (${upper})`);
	if (sigma === 0 && (mean < lower || mean > upper))
		throw new RangeError(`with sigma = 0 the mean ${mean} must lie within [${lower}, ${upper}]`);
}

/**
 * Standardised bounds α = (lower − μ)/σ, β = (upper − μ)/σ, and the probability Z = Φ(β) − Φ(α)
 * inside, computed from whichever tails keep it accurate (both bounds above the mean: Q(α) − Q(β)).
 */
function standardise(d: TruncatedNormal) {
	const alpha = (d.lower - d.mean) / d.sigma;
	const beta = (d.upper - d.mean) / d.sigma;
	const inside =
		alpha >= 0
			? normalUpperTail(alpha) - normalUpperTail(beta)
			: beta <= 0
				? normalCdf(beta) - normalCdf(alpha)
				: 1 - normalCdf(alpha) - normalUpperTail(beta);
	if (!(inside > 0)) {
		throw new RangeError(
			`the interval [${d.lower}, ${d.upper}] holds no representable probability of N(${d.mean}, ${d.sigma}²)`
		);
	}
	return { alpha, beta, inside };
}

/**
 * The mean of a truncated normal distribution:
 *
 *   E[X] = μ + σ (φ(α) − φ(β)) / (Φ(β) − Φ(α)),  α = (a − μ)/σ, β = (b − μ)/σ.
 *
 * References: N. L. Johnson, S. Kotz & N. Balakrishnan, Continuous Univariate Distributions,
 * vol. 1 (2nd ed., 1994), §10.1, eq. 13.134.
 * @throws {TypeError} for non-finite parameters. @throws {RangeError} for σ < 0, lower ≥ upper,
 * or an interval holding no representable probability.
 * @example truncatedNormalMean({ mean: 0, sigma: 1, lower: 0, upper: 40 }) // √(2/π) ≈ 0.7979
 */
export function truncatedNormalMean(d: TruncatedNormal): number {
	checkTruncated(d);
	if (d.sigma === 0) return d.mean;
	const { alpha, beta, inside } = standardise(d);
	return d.mean + (d.sigma * (normalDensity(alpha) - normalDensity(beta))) / inside;
}

/**
 * Draws from a truncated normal distribution by inversion: a uniform u is mapped to the value
 * whose truncated distribution function equals u. The lower half of the probability inside is
 * inverted through Φ, the upper half through the upper tail Q, so that neither end loses accuracy
 * to 1 − p rounding. Exactly one uniform per draw; the result always lies in [lower, upper]. The
 * tails at the bounds are computed once, here, not at every draw.
 * References: L. Devroye, Non-Uniform Random Variate Generation (1986), §II.2 (inversion);
 * the quantile is normalQuantile (Wichura, AS 241).
 * @throws as truncatedNormalMean.
 * @example const draw = truncatedNormalSampler({ mean: 9, sigma: 0.3, lower: 0, upper: 100 });
 *   draw(seededRandom(1)) // a distance near 9 Å, never below 0
 */
export function truncatedNormalSampler(d: TruncatedNormal): (random: RandomSource) => number {
	checkTruncated(d);
	const { mean, sigma, lower, upper } = d;
	if (sigma === 0) return () => mean;
	const { alpha, beta, inside } = standardise(d);
	const clamp = (z: number) => Math.min(upper, Math.max(lower, mean + sigma * z));
	if (alpha >= 0) {
		// Both bounds in the upper tail: invert Q from Q(α) down to Q(β).
		const top = normalUpperTail(alpha);
		return (random) => {
			const q = top - random.uniform() * inside;
			return clamp(q > 0 && q < 1 ? -normalQuantile(q) : alpha);
		};
	}
	const below = normalCdf(alpha);
	const above = normalUpperTail(beta);
	return (random) => {
		const u = random.uniform(); // in [0, 1)
		const p = below + u * inside;
		if (p <= 0.5) return clamp(p > 0 ? normalQuantile(p) : alpha);
		// 1 − p, without forming p: the mass above the draw.
		const q = above + (1 - u) * inside;
		// Rounding in the last bit may step just outside; the bounds themselves are valid values.
		return clamp(q > 0 && q < 1 ? -normalQuantile(q) : beta);
	};
}

/** One draw from a truncated normal distribution (truncatedNormalSampler, for a single draw). */
export function sampleTruncatedNormal(d: TruncatedNormal, random: RandomSource): number {
	return truncatedNormalSampler(d)(random);
}
