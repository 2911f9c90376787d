import { describe, expect, it } from 'vitest';
import {
	invertPositiveDefinite,
	minimiseLeastSquares,
	normalEquations,
	type LeastSquaresProblem
} from '$lib/science/leastSquares';

/*
 * Oracle: NIST Statistical Reference Datasets, nonlinear regression, Misra1a (lower difficulty):
 * y = b1·(1 − exp(−b2·x)), 14 observations, certified to 11 significant figures —
 * https://www.itl.nist.gov/div898/strd/nls/data/misra1a.shtml (Misra, D., NIST (1978), dental
 * research monomolecular adsorption study). Start 1 (500, 1e-4) is the far start.
 */
const X = [
	77.6, 114.9, 141.1, 190.8, 239.9, 289.0, 332.8, 378.4, 434.8, 477.3, 536.8, 593.1, 689.1, 760.0
];
const Y = [
	10.07, 14.73, 17.94, 23.93, 29.61, 35.18, 40.02, 44.82, 50.76, 55.05, 61.01, 66.4, 75.47, 81.78
];
const CERTIFIED = { b1: 2.3894212918e2, b2: 5.5015643181e-4 };
const CERTIFIED_SD = { b1: 2.7070075241, b2: 7.2668688436e-6 };
const CERTIFIED_RSS = 1.2455138894e-1;

const misra1a: LeastSquaresProblem = {
	count: X.length,
	evaluate(theta, residuals, jacobian) {
		const [b1, b2] = theta as [number, number];
		X.forEach((x, i) => {
			const e = Math.exp(-b2 * x);
			residuals[i] = Y[i]! - b1 * (1 - e);
			if (jacobian) {
				jacobian[2 * i] = 1 - e;
				jacobian[2 * i + 1] = b1 * x * e;
			}
		});
	}
};

describe('minimiseLeastSquares', () => {
	for (const start of [
		[500, 1e-4],
		[250, 5e-4]
	]) {
		it(`reaches the NIST certified Misra1a values from (${start.join(', ')})`, () => {
			const m = minimiseLeastSquares(misra1a, start);
			expect(Math.abs(m.parameters[0]! / CERTIFIED.b1 - 1)).toBeLessThan(1e-9);
			expect(Math.abs(m.parameters[1]! / CERTIFIED.b2 - 1)).toBeLessThan(1e-9);
			expect(Math.abs(m.ssr / CERTIFIED_RSS - 1)).toBeLessThan(1e-9);
			// The certified standard deviations are the linearised ones, s²(JᵀJ)⁻¹ with s² = RSS/12.
			const residuals = new Float64Array(X.length);
			const jacobian = new Float64Array(2 * X.length);
			misra1a.evaluate(m.parameters, residuals, jacobian);
			const inverse = invertPositiveDefinite(normalEquations(jacobian, residuals, 2).jtj, 2)!;
			const s2 = m.ssr / (X.length - 2);
			expect(Math.abs(Math.sqrt(s2 * inverse[0]!) / CERTIFIED_SD.b1 - 1)).toBeLessThan(1e-8);
			expect(Math.abs(Math.sqrt(s2 * inverse[3]!) / CERTIFIED_SD.b2 - 1)).toBeLessThan(1e-8);
		});
	}

	// Worked by hand: y = b·x through (1, 2) and (2, 4) has b = 2; with b ≤ 1 the minimum is the
	// bound itself, b = 1 exactly (the step is held at the bound, not clamped and retried).
	it('stops on a bound when the minimum lies beyond it', () => {
		const line: LeastSquaresProblem = {
			count: 2,
			upper: [1],
			evaluate(theta, residuals, jacobian) {
				residuals[0] = 2 - theta[0]!;
				residuals[1] = 4 - 2 * theta[0]!;
				if (jacobian) {
					jacobian[0] = 1;
					jacobian[1] = 2;
				}
			}
		};
		const m = minimiseLeastSquares(line, [0]);
		expect(m.parameters[0]).toBe(1);
		expect(m.ssr).toBe(1 + 4);
		expect(m.iterations).toBeLessThan(20);
	});

	it('refuses a start outside its bounds', () =>
		expect(() =>
			minimiseLeastSquares({ ...misra1a, lower: [0, 0], upper: [100, 1] }, [500, 1e-4])
		).toThrow(/start\[0\] = 500/));

	it('reports a singular normal matrix as null, not as huge numbers', () => {
		// Two identical columns: [[1, 1], [1, 1]] has no inverse.
		expect(invertPositiveDefinite(Float64Array.from([1, 1, 1, 1]), 2)).toBeNull();
		expect(Array.from(invertPositiveDefinite(Float64Array.from([4, 0, 0, 0.25]), 2)!)).toEqual([
			0.25, 0, 0, 4
		]);
	});
});
