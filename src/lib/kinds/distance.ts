import { distanceSchema } from '$lib/schemas/distance';
import { DISTANCE_METHODS, DISTANCE_METHOD_LABELS } from '$lib/schemas/vocabulary';
import { by, columnsFromFields, withAlternative } from './csvColumns';
import { defineKind } from './kind';
import { field, options, reference } from './formFields';

const FIELDS = [
	reference('centreAAccession', 'centre', { required: true }),
	reference('centreBAccession', 'centre', { required: true }),
	field('edgeToEdgeA', 'number', { required: true, unit: 'Å' }),
	field('centreToCentreA', 'number', { unit: 'Å' }),
	field('structureId', 'text', { required: true, hint: 'e.g. a PDB identifier' }),
	field('method', 'select', {
		required: true,
		options: options(DISTANCE_METHODS, DISTANCE_METHOD_LABELS)
	}),
	reference('sourceAccession', 'source'),
	field('note', 'textarea')
];

export const distance = defineKind({
	label: 'Distance',
	schema: distanceSchema,
	formFields: FIELDS,
	references: { centreAAccession: 'centre', centreBAccession: 'centre', sourceAccession: 'source' },
	listFields: ['centreAAccession', 'centreBAccession', 'edgeToEdgeA', 'structureId'],
	upload: {
		label: 'Distances',
		noun: 'distances',
		columns: [
			...withAlternative(
				withAlternative(
					columnsFromFields(FIELDS, { method: 'crystal_structure' }),
					'centreAAccession',
					'protein + centreALabel'
				),
				'centreBAccession',
				'protein + centreBLabel'
			),
			by('protein', 'Protein (name or accession)', 'with centreALabel and centreBLabel', ''),
			by('centreALabel', 'Centre A label', 'label of centre A within that protein', ''),
			by('centreBLabel', 'Centre B label', 'label of centre B within that protein', '')
		]
	},
	submissionTitle: (d) => `${d.centreAAccession} – ${d.centreBAccession}`
});
