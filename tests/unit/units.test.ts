import { describe, expect, it } from 'vitest';
import { potentialToMv, temperatureToK } from '$lib/science/units';
import { FARADAY_C_PER_MOL, GAS_J_PER_MOL_K } from '$lib/science/constants';

describe('units and constants', () => {
	it('converts volts to millivolts', () => expect(potentialToMv(-0.42, 'V')).toBeCloseTo(-420, 9));
	it('converts °C to K', () => expect(temperatureToK(25, 'C')).toBeCloseTo(298.15, 9));
	it('rejects temperatures below absolute zero', () =>
		expect(() => temperatureToK(-300, 'C')).toThrow(RangeError));
	// CODATA 2018: F = 96 485.332 12 C/mol, R = 8.314 462 618 J/(mol K) (both exact).
	it('derives F and R to CODATA 2018', () => {
		expect(FARADAY_C_PER_MOL).toBeCloseTo(96485.33212, 4);
		expect(GAS_J_PER_MOL_K).toBeCloseTo(8.314462618, 8);
	});
});
