import { describe, expect, it } from 'vitest';
import { fieldLabel, formatKindField } from '$lib/kinds';
import { presentEntry } from '../../src/routes/e/[accession=accession]/[[version=version]]/presentEntry';

// An invented potential, as a version stores it.
const potential = {
	centreAccession: 'HL000008',
	couple: '[4Fe-4S]2+/1+',
	reportedValue: -0.62,
	reportedUnit: 'V',
	referenceElectrode: 'AgAgCl_sat',
	ph: 7.5,
	temperatureK: 298.15,
	method: 'epr_titration',
	uncertaintyMv: 10
};

describe('the words of an entry page, made by its load', () => {
	const words = presentEntry('potential', potential);
	it('labels and writes each field as the kinds’ modules do, in the data’s order', () => {
		expect(words.kindLabel).toBe('Potential');
		expect(words.fields).toEqual(
			Object.entries(potential).map(([field, value]) => ({
				field,
				label: fieldLabel('potential', field),
				text: formatKindField('potential', field, value)
			}))
		);
	});
	it('names the headline’s method and electrode', () => {
		expect(words.headline).toEqual({
			method: 'EPR-monitored redox titration',
			electrode: { code: 'AgAgCl_sat', label: 'Ag/AgCl (saturated KCl)' }
		});
		expect(words.conversion).toMatch(/^Converted from Ag\/AgCl \(saturated KCl\)/);
	});
	it('keeps a method no vocabulary knows as it is, and an unknown electrode as none', () => {
		const odd = presentEntry('potential', {
			...potential,
			method: 'retired_method',
			referenceElectrode: 'Hg'
		});
		expect(odd.headline).toEqual({ method: 'retired_method', electrode: null });
		expect(odd.conversion).toBeNull();
	});
	it('says nothing of a conversion for other kinds', () => {
		const distance = presentEntry('distance', { edgeToEdgeA: 9.1, method: 'crystal_structure' });
		expect(distance.kindLabel).toBe('Distance');
		expect(distance.conversion).toBeNull();
		expect(distance.headline.electrode).toBeNull();
	});
});
