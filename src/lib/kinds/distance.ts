import { distanceSchema } from '$lib/schemas/distance';
import { DISTANCE_METHODS, DISTANCE_METHOD_LABELS } from '$lib/schemas/vocabulary';
import { defineKind } from './kind';
import { ACCESSION_HINT, field, options } from './formFields';

export const distance = defineKind({
	schema: distanceSchema,
	formFields: [
		field('centreAAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('centreBAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('edgeToEdgeA', 'number', { required: true, unit: 'Å' }),
		field('centreToCentreA', 'number', { unit: 'Å' }),
		field('structureId', 'text', { required: true, hint: 'e.g. a PDB identifier' }),
		field('method', 'select', {
			required: true,
			options: options(DISTANCE_METHODS, DISTANCE_METHOD_LABELS)
		}),
		field('sourceAccession', 'text', { hint: ACCESSION_HINT }),
		field('note', 'textarea')
	],
	references: { centreAAccession: 'centre', centreBAccession: 'centre', sourceAccession: 'source' },
	submissionTitle: (d) => `${d.centreAAccession} – ${d.centreBAccession}`
});
