import { describe, expect, it } from 'vitest';
import { percentile, seededRandom } from '$lib/science';

describe('seeded random numbers', () => {
	it('normals have mean 0 and variance 1', () => {
		const r = seededRandom(42);
		const xs = Array.from({ length: 20000 }, () => r.normal());
		const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
		const variance = xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1);
		expect(Math.abs(mean)).toBeLessThan(0.03);
		expect(variance).toBeCloseTo(1, 1);
	});
	// Hyndman & Fan (1996) definition 7, as in R's quantile(type = 7): quantile(1:10, 0.05) = 1.45.
	it('percentile interpolates as R type 7', () => {
		const xs = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
		expect(percentile(xs, 5)).toBeCloseTo(1.45, 12);
		expect(percentile(xs, 50)).toBeCloseTo(5.5, 12);
	});
});
