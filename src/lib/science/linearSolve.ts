/**
 * Solves A x = b for a small dense matrix by Gaussian elimination with partial pivoting
 * (Golub & Van Loan, *Matrix Computations*, 4th ed., Algorithm 3.4.1). A is row-major in a
 * Float64Array and is not modified. Used where thousands of small systems are solved in a loop
 * (Monte Carlo over chains), for which general matrix objects cost more than the arithmetic.
 * @returns x, or null when elimination meets an exactly zero pivot (A singular).
 */
export function solveDense(
	a: Float64Array,
	n: number,
	b: Float64Array,
	transpose = false
): Float64Array | null {
	const m = new Float64Array(n * n);
	if (transpose) {
		for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m[i * n + j] = a[j * n + i]!;
	} else {
		m.set(a.subarray(0, n * n));
	}
	const x = Float64Array.from(b);
	for (let k = 0; k < n; k++) {
		let pivot = k;
		for (let i = k + 1; i < n; i++)
			if (Math.abs(m[i * n + k]!) > Math.abs(m[pivot * n + k]!)) pivot = i;
		// Rate matrices legitimately span twenty decades, so only an exact zero pivot counts as
		// singular; callers check the solution for finiteness.
		if (m[pivot * n + k] === 0) return null;
		if (pivot !== k) {
			for (let j = 0; j < n; j++) {
				const t = m[k * n + j]!;
				m[k * n + j] = m[pivot * n + j]!;
				m[pivot * n + j] = t;
			}
			const t = x[k]!;
			x[k] = x[pivot]!;
			x[pivot] = t;
		}
		const d = m[k * n + k]!;
		for (let i = k + 1; i < n; i++) {
			const f = m[i * n + k]! / d;
			if (f === 0) continue;
			for (let j = k; j < n; j++) m[i * n + j] = m[i * n + j]! - f * m[k * n + j]!;
			x[i] = x[i]! - f * x[k]!;
		}
	}
	for (let i = n - 1; i >= 0; i--) {
		let s = x[i]!;
		for (let j = i + 1; j < n; j++) s -= m[i * n + j]! * x[j]!;
		x[i] = s / m[i * n + i]!;
	}
	return x;
}
