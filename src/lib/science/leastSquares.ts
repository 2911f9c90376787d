/*
 * Bounded nonlinear least squares by Levenberg–Marquardt, with Marquardt's scaling of the damping
 * by the diagonal of JᵀJ, so that a step does not depend on the units of the parameters.
 *
 * Minimises SSR(θ) = Σ r_i(θ)², r_i = y_i − model_i(θ). Each iteration solves
 *   (JᵀJ + λ·D) δ = Jᵀr,   D = diag(d_j),  d_j = the largest (JᵀJ)_jj met so far,
 * and takes θ + δ (clamped to the bounds) only when it lowers the sum of squares; λ falls by 10
 * after a step taken and rises by 10 after one refused. Stops when a step taken lowers the sum by
 * less than `relativeTolerance` of it, when every parameter moves by less than `stepTolerance` of
 * its size (or of its `typical` size), when no damping finds a lower sum (λ > 1e16), or after
 * `maxIterations`.
 *
 * Why our own rather than ml-levenberg-marquardt: that package adds an absolute λ·I (its damping
 * floor is 1e-7 whatever the units), takes steps that raise the sum of squares, and stops only on
 * an absolute error; with it, titration fits moved with the signal's units.
 *
 * References: D. W. Marquardt, J. Soc. Ind. Appl. Math. 11, 431 (1963) (the method, diagonal
 * scaling); J. J. Moré's 1978 analysis of the method (D as the running maximum of the column
 * norms); W. H. Press et al., *Numerical Recipes* (3rd ed.), §15.5.2 (the λ schedule, ×10 / ÷10).
 */

export interface LeastSquaresProblem {
	/** Number of observations. */
	count: number;
	/**
	 * Writes the residuals y_i − model_i(θ) into `residuals` and, when `jacobian` is given, the
	 * partial derivatives ∂model_i/∂θ_j into it, row-major (`count` rows of θ.length).
	 */
	evaluate(theta: readonly number[], residuals: Float64Array, jacobian?: Float64Array): void;
	/** Lower bounds per parameter (−Infinity for none). */
	lower?: readonly number[];
	/** Upper bounds per parameter (Infinity for none). */
	upper?: readonly number[];
}

export interface LeastSquaresOptions {
	/** @default 500 */
	maxIterations?: number;
	/** @default 1e-14 */
	relativeTolerance?: number;
	/** @default 1e-12 */
	stepTolerance?: number;
	/** Size below which a parameter's step is measured absolutely. @default 1 for each */
	typical?: readonly number[];
}

export interface LeastSquaresMinimum {
	parameters: number[];
	ssr: number;
	iterations: number;
}

function sumOfSquares(r: Float64Array): number {
	let s = 0;
	for (let i = 0; i < r.length; i++) s += r[i]! * r[i]!;
	return s;
}

/**
 * Solves A x = b for a symmetric positive-definite A (p×p, row-major) by Cholesky, in place of
 * nothing (A and b are left alone). Null when A is not positive definite to working precision.
 */
export function solvePositiveDefinite(
	a: Float64Array,
	b: Float64Array,
	p: number
): Float64Array | null {
	const l = new Float64Array(p * p);
	for (let i = 0; i < p; i++) {
		for (let j = 0; j <= i; j++) {
			let s = a[i * p + j]!;
			for (let k = 0; k < j; k++) s -= l[i * p + k]! * l[j * p + k]!;
			if (i === j) {
				if (!(s > 1e-14 * Math.abs(a[i * p + i]!)) || !(s > 0)) return null;
				l[i * p + i] = Math.sqrt(s);
			} else l[i * p + j] = s / l[j * p + j]!;
		}
	}
	const x = new Float64Array(p);
	for (let i = 0; i < p; i++) {
		let s = b[i]!;
		for (let k = 0; k < i; k++) s -= l[i * p + k]! * x[k]!;
		x[i] = s / l[i * p + i]!;
	}
	for (let i = p - 1; i >= 0; i--) {
		let s = x[i]!;
		for (let k = i + 1; k < p; k++) s -= l[k * p + i]! * x[k]!;
		x[i] = s / l[i * p + i]!;
	}
	return x;
}

/**
 * The inverse of a symmetric positive-definite matrix (p×p, row-major), computed on its
 * Jacobi-scaled form (unit diagonal) so that the test for singularity is relative; null when it
 * is singular to working precision (a column of JᵀJ that others explain, a parameter the data
 * cannot determine).
 */
export function invertPositiveDefinite(a: Float64Array, p: number): Float64Array | null {
	const scale = new Float64Array(p);
	for (let i = 0; i < p; i++) {
		const d = a[i * p + i]!;
		if (!(d > 0) || !Number.isFinite(d)) return null;
		scale[i] = 1 / Math.sqrt(d);
	}
	const scaled = new Float64Array(p * p);
	for (let i = 0; i < p; i++)
		for (let j = 0; j < p; j++) scaled[i * p + j] = a[i * p + j]! * scale[i]! * scale[j]!;
	const inverse = new Float64Array(p * p);
	const unit = new Float64Array(p);
	for (let j = 0; j < p; j++) {
		unit.fill(0);
		unit[j] = 1;
		const column = solvePositiveDefinite(scaled, unit, p);
		if (!column) return null;
		for (let i = 0; i < p; i++) inverse[i * p + j] = column[i]! * scale[i]! * scale[j]!;
	}
	return inverse;
}

/** JᵀJ (p×p) and Jᵀr (p) of a row-major Jacobian. */
export function normalEquations(
	jacobian: Float64Array,
	residuals: Float64Array,
	p: number
): { jtj: Float64Array; jtr: Float64Array } {
	const n = residuals.length;
	const jtj = new Float64Array(p * p);
	const jtr = new Float64Array(p);
	for (let i = 0; i < n; i++) {
		const row = i * p;
		const r = residuals[i]!;
		for (let a = 0; a < p; a++) {
			const ja = jacobian[row + a]!;
			jtr[a] = jtr[a]! + ja * r;
			for (let b = 0; b <= a; b++) jtj[a * p + b] = jtj[a * p + b]! + ja * jacobian[row + b]!;
		}
	}
	for (let a = 0; a < p; a++) for (let b = 0; b < a; b++) jtj[b * p + a] = jtj[a * p + b]!;
	return { jtj, jtr };
}

/**
 * The damped step, with the parameters that sit on a bound and would step beyond it held there
 * (their rows and columns left out of the system; an active set, re-solved until no held
 * parameter is left to add): clamping such a step instead would leave the others a step that no
 * longer points downhill, and the search would crawl along the bound. Null when the damped
 * system is not positive definite.
 */
function boundedStep(
	jtj: Float64Array,
	jtr: Float64Array,
	d: Float64Array,
	lambda: number,
	theta: readonly number[],
	lower: readonly number[],
	upper: readonly number[]
): Float64Array | null {
	const p = theta.length;
	const held = new Array<boolean>(p).fill(false);
	const free: number[] = [];
	for (let round = 0; round <= p; round++) {
		free.length = 0;
		for (let j = 0; j < p; j++) if (!held[j]) free.push(j);
		const q = free.length;
		const step = new Float64Array(p);
		if (q === 0) return step;
		const damped = new Float64Array(q * q);
		const rhs = new Float64Array(q);
		for (let i = 0; i < q; i++) {
			const a = free[i]!;
			rhs[i] = jtr[a]!;
			for (let j = 0; j < q; j++) damped[i * q + j] = jtj[a * p + free[j]!]!;
			damped[i * q + i] = damped[i * q + i]! + lambda * Math.max(d[a]!, 1e-300);
		}
		const solved = solvePositiveDefinite(damped, rhs, q);
		if (!solved) return null;
		for (let i = 0; i < q; i++) step[free[i]!] = solved[i]!;
		let more = false;
		for (let j = 0; j < p; j++) {
			if (held[j]) continue;
			if ((theta[j]! <= lower[j]! && step[j]! < 0) || (theta[j]! >= upper[j]! && step[j]! > 0)) {
				held[j] = true;
				more = true;
			}
		}
		if (!more) return step;
	}
	return null;
}

/**
 * Minimises the sum of squared residuals from `start` (see the file's comment for the method).
 * Parameters are best given on scales of order one: the step test is relative to
 * max(|θ_j|, typical_j).
 * @throws {RangeError} when `start` has the wrong length or lies outside the bounds, or the
 * residuals at the start are not finite.
 * @example
 * // y = b·x through (1, 2), (2, 4): b = 2
 * minimiseLeastSquares({ count: 2, evaluate: (t, r, j) => { r[0] = 2 - t[0]; r[1] = 4 - 2 * t[0]; if (j) { j[0] = 1; j[1] = 2; } } }, [0]).parameters // [2]
 */
export function minimiseLeastSquares(
	problem: LeastSquaresProblem,
	start: readonly number[],
	options: LeastSquaresOptions = {}
): LeastSquaresMinimum {
	const p = start.length;
	const n = problem.count;
	const lower = problem.lower ?? Array.from({ length: p }, () => -Infinity);
	const upper = problem.upper ?? Array.from({ length: p }, () => Infinity);
	if (lower.length !== p || upper.length !== p)
		throw new RangeError(`bounds must have ${p} entries, one per parameter`);
	start.forEach((v, j) => {
		if (!Number.isFinite(v) || v < lower[j]! || v > upper[j]!)
			throw new RangeError(`start[${j}] = ${v} is not a finite value inside its bounds`);
	});
	const maxIterations = options.maxIterations ?? 500;
	const relativeTolerance = options.relativeTolerance ?? 1e-14;
	const stepTolerance = options.stepTolerance ?? 1e-12;
	const typical = options.typical ?? Array.from({ length: p }, () => 1);

	let theta = [...start];
	const residuals = new Float64Array(n);
	const jacobian = new Float64Array(n * p);
	const trialResiduals = new Float64Array(n);
	problem.evaluate(theta, residuals, jacobian);
	let ssr = sumOfSquares(residuals);
	if (!Number.isFinite(ssr)) throw new RangeError('the residuals at the start are not finite');
	const d = new Float64Array(p);
	let lambda = 1e-3;
	let iterations = 0;
	while (iterations < maxIterations && ssr > 0) {
		iterations++;
		const { jtj, jtr } = normalEquations(jacobian, residuals, p);
		for (let j = 0; j < p; j++) d[j] = Math.max(d[j]!, jtj[j * p + j]!);
		let accepted = false;
		let converged = false;
		while (lambda <= 1e16) {
			const step = boundedStep(jtj, jtr, d, lambda, theta, lower, upper);
			if (!step) {
				lambda *= 10;
				continue;
			}
			const trial = new Array<number>(p);
			let small = true;
			for (let j = 0; j < p; j++) {
				trial[j] = Math.min(upper[j]!, Math.max(lower[j]!, theta[j]! + step[j]!));
				if (
					Math.abs(trial[j]! - theta[j]!) >
					stepTolerance * Math.max(Math.abs(theta[j]!), typical[j]!)
				)
					small = false;
			}
			problem.evaluate(trial, trialResiduals);
			const trialSsr = sumOfSquares(trialResiduals);
			if (Number.isFinite(trialSsr) && trialSsr < ssr) {
				converged = ssr - trialSsr <= relativeTolerance * ssr || small;
				theta = trial;
				ssr = trialSsr;
				lambda = Math.max(lambda / 10, 1e-12);
				accepted = true;
				break;
			}
			lambda *= 10;
		}
		if (!accepted) break; // no damping lowers the sum: a minimum to working precision
		problem.evaluate(theta, residuals, jacobian);
		if (converged) break;
	}
	return { parameters: theta, ssr, iterations };
}
