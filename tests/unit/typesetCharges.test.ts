import { describe, expect, it } from 'vitest';
import { typesetCharges } from '../../src/lib/format';

/* The trade's way of printing couples (IUPAC Red Book 2005, IR-3.4: charges as right superscripts). */
describe('typesetCharges', () => {
	it.each([
		['[4Fe-4S]2+/1+', '[4Fe-4S]²⁺/¹⁺'],
		['[4Fe-4S]3+/2+', '[4Fe-4S]³⁺/²⁺'],
		['[3Fe-4S]1+/0', '[3Fe-4S]¹⁺/⁰'],
		['[2Fe-2S]2+/1+', '[2Fe-2S]²⁺/¹⁺'],
		['Cu2+/Cu+', 'Cu²⁺/Cu⁺'],
		['Fe3+/Fe2+', 'Fe³⁺/Fe²⁺'],
		['2+/1+', '²⁺/¹⁺'],
		['Q/Q•−', 'Q/Q•⁻'],
		['[4Fe-4S]1−', '[4Fe-4S]¹⁻']
	])('%s → %s', (typed, shown) => {
		expect(typesetCharges(typed)).toBe(shown);
	});

	it.each(['FAD/FADH2', 'ox/red', 'Q/QH2', 'FMN/FMNH•', 'heme 0', 'Fe(III)/Fe(II)', ''])(
		'leaves %j as typed (counts and names are not charges)',
		(typed) => {
			expect(typesetCharges(typed)).toBe(typed);
		}
	);
});
