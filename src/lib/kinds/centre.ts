import { centreSchema } from '$lib/schemas/centre';
import { COFACTOR_KINDS, COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';
import { by, columnsFromFields, withAlternative } from './csvColumns';
import { defineKind } from './kind';
import { field, options, reference } from './formFields';

const FIELDS = [
	reference('proteinAccession', 'protein', { required: true }),
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
];

export const centre = defineKind({
	label: 'Centre',
	schema: centreSchema,
	formFields: FIELDS,
	references: { proteinAccession: 'protein' },
	listFields: ['proteinAccession', 'label', 'cofactorKind', 'ligation'],
	upload: {
		label: 'Centres and proteins',
		noun: 'centres',
		columns: [
			...withAlternative(columnsFromFields(FIELDS), 'proteinAccession', 'proteinName + organism'),
			by(
				'proteinName',
				'Protein name',
				'an approved protein, one made by an earlier row, or a new one (give organism)',
				'Demo hydrogenase-like complex'
			),
			by('organism', 'Organism', 'for a new protein', 'Calorivorax demonstrans HL-1 (fictional)'),
			by('uniprot', 'UniProtKB', 'for a new protein, optional', ''),
			by('structureIds', 'Structures', 'for a new protein, optional', 'DEMO1')
		]
	},
	submissionTitle: (d) => `${d.label} of ${d.proteinAccession}`
});
