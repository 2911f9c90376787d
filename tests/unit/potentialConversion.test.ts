import { describe, expect, it } from 'vitest';
import { conversionNote, potentialConversionNote } from '$lib/catalogue/potentialConversion';

// The sentence a potential's page shows under its data: how its Em was converted, from the
// version's own electrode and temperature (offsets: Bard & Faulkner 2001 Table C.2; Sawyer,
// Sobkowiak & Roberts 1995 Table 5.1 — see referenceElectrodes.ts).
describe('how a potential was converted to SHE', () => {
	it('SCE: the temperature law at the stated temperature', () =>
		// 241.2 − 26.44 − 2.8 − 0.0576 = 211.9 mV at 65 °C.
		expect(conversionNote('SCE', 338.15)).toMatch(
			/^Converted from SCE \(saturated KCl\) at 65 °C with the SCE's temperature law .*0–70 °C\): \+211\.9\u00a0mV\.$/
		));
	it('Ag/AgCl: the 25 °C offset and its range', () =>
		expect(conversionNote('AgAgCl_3M', 293.15)).toBe(
			'Converted from Ag/AgCl (3 M KCl) with its 25 °C offset, +210\u00a0mV, at 20 °C (25 °C values are used for 15–35 °C only).'
		));
	it('no temperature: says 25 °C was assumed', () =>
		expect(conversionNote('AgAgCl_sat', null)).toContain(
			'25 °C (no temperature given: 25 °C assumed)'
		));
	// −(RT/2F)·ln(1.01325) = −0.169 mV at 25 °C (CODATA 2018 R, F).
	it('NHE: taken as SHE, with the size of the 1 atm / 1 bar part', () =>
		expect(conversionNote('NHE', 298.15)).toContain('alone is 0.17 mV'));
	it('a version approved before the ranges were checked says its value may be off', () =>
		expect(conversionNote('AgAgCl_sat', 338.15)).toMatch(
			/outside the 15–35 °C .* off by tens of mV/
		));
	it('reads the electrode and temperature from a version’s data, or gives none', () => {
		expect(
			potentialConversionNote({ referenceElectrode: 'SHE', temperatureK: null, other: 1 })
		).toBe('Reported vs SHE: Em vs SHE is the value as reported.');
		expect(potentialConversionNote({ name: 'a protein' })).toBeNull();
	});
});
