import { describe, expect, it } from 'vitest';
import { templateCsv } from '$lib/catalogue/uploadColumns';
import { columnForHeader } from '$lib/catalogue/uploadColumns';
import {
	fromPublicFields,
	publicFieldName,
	storedFieldName,
	toPublicFields
} from '$lib/kinds/publicNames';

describe('public names of the ångström fields', () => {
	it('say Angstrom where the stored name ends in a bare A, and leave every other name alone', () => {
		expect(publicFieldName('edgeToEdgeA')).toBe('edgeToEdgeAngstrom');
		expect(publicFieldName('centreToCentreA')).toBe('centreToCentreAngstrom');
		expect(publicFieldName('coordinatesA')).toBe('coordinatesAngstrom');
		expect(publicFieldName('centreAAccession')).toBe('centreAAccession');
		expect(storedFieldName('edgeToEdgeAngstrom')).toBe('edgeToEdgeA');
		expect(storedFieldName('edgeToEdgeA')).toBe('edgeToEdgeA');
	});
	it('rename data going out, in order, and take either name coming in', () => {
		const stored = { centreAAccession: 'HL000011', edgeToEdgeA: 9.5, centreToCentreA: null };
		const shown = toPublicFields(stored);
		expect(Object.keys(shown)).toEqual([
			'centreAAccession',
			'edgeToEdgeAngstrom',
			'centreToCentreAngstrom'
		]);
		expect(fromPublicFields(shown)).toEqual({ ok: true, data: stored });
		expect(fromPublicFields(stored)).toEqual({ ok: true, data: stored });
		expect(fromPublicFields({ edgeToEdgeA: 1, edgeToEdgeAngstrom: 2 })).toEqual({
			ok: false,
			fields: { edgeToEdgeAngstrom: [expect.stringMatching(/given twice/)] }
		});
	});
	it('name the upload columns publicly and still match the old headers', () => {
		expect(templateCsv('distance').split('\r\n')[0]).toContain(',edgeToEdgeAngstrom,');
		expect(templateCsv('centre').split('\r\n')[0]).toContain('coordinatesAngstrom');
		for (const header of [
			'edgeToEdgeAngstrom',
			'edge_to_edge_angstrom',
			'edgeToEdgeA',
			'Edge to edge (Å)'
		])
			expect(columnForHeader('distance', header)?.name, header).toBe('edgeToEdgeA');
		// "centre A" stays the accession column of centre A.
		expect(columnForHeader('distance', 'centre_a_accession')?.name).toBe('centreAAccession');
	});
});
