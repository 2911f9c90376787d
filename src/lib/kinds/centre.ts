import { centreSchema } from '$lib/schemas/centre';
import { COFACTOR_KINDS, COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';
import { defineKind } from './kind';
import { ACCESSION_HINT, field, options } from './formFields';

export const centre = defineKind({
	schema: centreSchema,
	formFields: [
		field('proteinAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('label', 'text', { required: true, hint: 'as in the source, e.g. N2 or heme bL' }),
		field('cofactorKind', 'select', {
			required: true,
			options: options(COFACTOR_KINDS, COFACTOR_KIND_LABELS)
		}),
		field('ligation', 'text', { hint: 'e.g. Cys4, Cys3His, Cys2His2' }),
		field('chainId', 'text'),
		field('residues', 'numberList', { hint: 'residue numbers, comma-separated' }),
		field('coordinatesA', 'coordinates', { unit: 'Å', hint: 'x, y, z of the centroid' }),
		field('note', 'textarea')
	],
	references: { proteinAccession: 'protein' },
	submissionTitle: (d) => `${d.label} of ${d.proteinAccession}`
});
