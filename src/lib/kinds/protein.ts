import { proteinSchema } from '$lib/schemas/protein';
import { defineKind } from './kind';
import { field } from './formFields';

export const protein = defineKind({
	label: 'Protein',
	schema: proteinSchema,
	formFields: [
		field('name', 'text', { required: true }),
		field('organism', 'text', { required: true }),
		field('uniprot', 'text', { hint: 'UniProtKB accession, e.g. P69905' }),
		field('structureIds', 'textList', { hint: 'PDB or model identifiers, comma-separated' }),
		field('description', 'textarea')
	],
	references: {},
	listFields: ['name', 'organism'],
	submissionTitle: (d) => `${d.name} (${d.organism})`
});
