import { describe, expect, it } from 'vitest';
import { checkTypicalRange, typicalRange } from '$lib/catalogue/typicalRanges';

describe('typical potential ranges', () => {
	// Well-known values that any sensible range must hold (all from memory, rounded):
	it.each([
		['fe4s4', '[4Fe-4S]2+/1+', -400], // bacterial 2[4Fe-4S] ferredoxin, about −400 mV
		['fe4s4_hipip', '[4Fe-4S]3+/2+', 350], // purple-bacterial HiPIP, about +350 mV
		['heme_c', 'Fe3+/Fe2+', 260], // mitochondrial cytochrome c, about +260 mV
		['cu_type1', 'Cu2+/Cu+', 310], // azurin, about +310 mV
		['fe2s2_ferredoxin', '[2Fe-2S]2+/1+', -420], // plant-type ferredoxin, about −420 mV
		['fe2s2_rieske', '[2Fe-2S]2+/1+', 280] // bc1-complex Rieske centre, about +280 mV
	] as const)('%s %s holds %d mV', (kind, couple, em) => {
		expect(checkTypicalRange(kind, couple, em)).toBeNull();
	});
	it('warns about a sign slip, naming the range and its source', () => {
		const w = checkTypicalRange('fe4s4', '[4Fe-4S]2+/1+', 400);
		expect(w?.message).toContain('above the typical range');
		// Unicode minus and a no-break space before the unit, as every number on screen.
		expect(w?.message).toContain('(−750\u00a0mV to −50\u00a0mV vs SHE)');
		expect(w?.message).toMatch(/^400\u00a0mV vs SHE is above/);
		expect(w?.range.source).toMatch(/typical range from a published survey.*bounds approximate/);
	});
	it('has no range for "other" or an unknown couple, so it never warns there', () => {
		expect(typicalRange('other', 'X/Y')).toBeNull();
		expect(checkTypicalRange('heme_b', 'Fe4+/Fe3+', 1500)).toBeNull();
	});
});
