import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { nernstFractionReduced, nernstSlopeMvPerDecade } from '$lib/science';

describe('Nernst equation', () => {
	// 2.303RT/F = 59.16 mV at 25 °C: Bard & Faulkner, Electrochemical Methods, 2nd ed., §2.1 (from memory);
	// computed here from CODATA 2018 R and F.
	it('slope is 59.16 mV per decade at 298.15 K for n = 1', () =>
		expect(nernstSlopeMvPerDecade(1, 298.15)).toBeCloseTo(59.159, 3));
	it('slope halves for n = 2', () =>
		expect(nernstSlopeMvPerDecade(2, 298.15)).toBeCloseTo(29.58, 3));
	it('is half reduced at Em', () =>
		expect(nernstFractionReduced(-250, -250, 1, 298.15)).toBeCloseTo(0.5, 12));
	it('is 1/11 reduced one Nernst slope above Em (ox/red = 10)', () =>
		expect(nernstFractionReduced(-250 + 59.1596, -250, 1, 298.15)).toBeCloseTo(1 / 11, 5));
	it('stays within 0–1 without overflow far from Em', () => {
		expect(nernstFractionReduced(5000, 0)).toBeLessThan(1e-80);
		expect(nernstFractionReduced(50_000, 0)).toBe(0);
		expect(nernstFractionReduced(-5000, 0)).toBe(1);
	});
	it('rejects n = 0 and T = 0', () => {
		expect(() => nernstFractionReduced(0, 0, 0)).toThrow(RangeError);
		expect(() => nernstFractionReduced(0, 0, 1, 0)).toThrow(RangeError);
	});
	it('is monotonic in potential', () => {
		fc.assert(
			fc.property(
				fc.double({ min: -800, max: 800, noNaN: true }),
				fc.double({ min: 0.1, max: 100, noNaN: true }),
				(e, d) => {
					expect(nernstFractionReduced(e + d, 0)).toBeLessThanOrEqual(nernstFractionReduced(e, 0));
				}
			)
		);
	});
});
