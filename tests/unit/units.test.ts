import { describe, expect, it } from 'vitest';
import { ENERGY_UNITS, convertEnergy, potentialToMv, temperatureToK } from '$lib/science/units';
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

describe('energy units', () => {
	// The thermochemical calorie is 4.184 J exactly (ISO 80000-5); 1 cm⁻¹ = hc·100 N_A J/mol and
	// 1 eV = e·N_A J/mol from the exact SI constants: 1 kcal/mol = 349.7550 cm⁻¹,
	// 1 eV = 96.485 332 12 kJ/mol (= F/1000, CODATA 2018).
	it('converts kcal/mol, kJ/mol, cm⁻¹ and eV', () => {
		expect(convertEnergy(1, 'kcal/mol', 'kJ/mol')).toBe(4.184);
		expect(convertEnergy(1, 'kcal/mol', 'cm-1')).toBeCloseTo(349.755, 3);
		expect(convertEnergy(1, 'eV', 'kJ/mol')).toBeCloseTo(96.48533212, 7);
		expect(convertEnergy(12.5, 'kJ/mol', 'kJ/mol')).toBe(12.5);
	});
	it('round-trips between every pair', () => {
		for (const from of ENERGY_UNITS)
			for (const to of ENERGY_UNITS)
				expect(convertEnergy(convertEnergy(-3.7, from, to), to, from)).toBeCloseTo(-3.7, 12);
	});
	it('refuses a value that is not finite', () =>
		expect(() => convertEnergy(Number.NaN, 'kJ/mol', 'eV')).toThrow(TypeError));
});
