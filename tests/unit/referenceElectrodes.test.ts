import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	REFERENCE_ELECTRODES,
	electrodeOffsetMv,
	fromSHE,
	toSHE
} from '$lib/science/referenceElectrodes';

describe('reference electrode offsets at 25 °C', () => {
	// Bard & Faulkner, Electrochemical Methods, 2nd ed. (2001), Table C.2: SCE 0.2412 V vs SHE (from memory).
	it('SCE is +241.2 mV vs SHE', () => expect(electrodeOffsetMv('SCE')).toBeCloseTo(241.2, 6));
	// Sawyer, Sobkowiak & Roberts, Electrochemistry for Chemists, 2nd ed. (1995), Table 5.1 (from memory).
	it('Ag/AgCl in saturated KCl is +197 mV vs SHE', () =>
		expect(electrodeOffsetMv('AgAgCl_sat')).toBe(197));
	it('Ag/AgCl in 3 M KCl is +210 mV vs SHE', () =>
		expect(electrodeOffsetMv('AgAgCl_3M')).toBe(210));
	it('Ag/AgCl in 3.5 M KCl is +205 mV vs SHE', () =>
		expect(electrodeOffsetMv('AgAgCl_3.5M')).toBe(205));
	it('Ag/AgCl in 1 M KCl is +235 mV vs SHE', () =>
		expect(electrodeOffsetMv('AgAgCl_1M')).toBe(235));
	// NHE taken equal to SHE: common practice, no source.
	it('NHE equals SHE', () => expect(electrodeOffsetMv('NHE')).toBe(0));
});

describe('SCE temperature law', () => {
	// Bard & Faulkner Table C.2: E = 0.2412 − 6.61e-4 (t−25) − 1.75e-6 (t−25)² − 9.0e-10 (t−25)³ V.
	it('at 35 °C the SCE is 241.2 − 6.61 − 0.175 − 0.0009 mV', () =>
		expect(electrodeOffsetMv('SCE', 308.15)).toBeCloseTo(241.2 - 6.61 - 0.175 - 0.0009, 6));
	it('refuses temperatures outside 0–70 °C', () =>
		expect(() => electrodeOffsetMv('SCE', 400)).toThrow(RangeError));
	it('Ag/AgCl offsets are 25 °C values at any temperature', () =>
		expect(electrodeOffsetMv('AgAgCl_sat', 338.15)).toBe(197));
});

describe('toSHE / fromSHE', () => {
	it('converts a potential vs Ag/AgCl (sat. KCl) to SHE', () =>
		expect(toSHE(-600, 'AgAgCl_sat')).toBe(-403));
	it('converts from SHE to SCE', () => expect(fromSHE(0, 'SCE')).toBeCloseTo(-241.2, 9));
	it('rejects an unknown electrode', () =>
		expect(() => toSHE(0, 'Hg/HgO' as never)).toThrow(/unknown reference electrode/));
	it('rejects a non-finite value', () => expect(() => toSHE(Number.NaN, 'SHE')).toThrow(TypeError));
	it('round-trips every electrode and temperature in range', () => {
		fc.assert(
			fc.property(
				fc.double({ min: -2000, max: 2000, noNaN: true }),
				fc.constantFrom(...REFERENCE_ELECTRODES),
				fc.double({ min: 273.15, max: 343.15, noNaN: true }),
				(mv, electrode, t) => {
					expect(Math.abs(fromSHE(toSHE(mv, electrode, t), electrode, t) - mv)).toBeLessThan(1e-9);
				}
			)
		);
	});
});
