import { sourceSchema } from '$lib/schemas/source';
import { SOURCE_KINDS } from '$lib/schemas/vocabulary';
import { defineKind } from './kind';
import { field, options } from './formFields';

export const source = defineKind({
	label: 'Source',
	schema: sourceSchema,
	formFields: [
		field('sourceKind', 'select', {
			required: true,
			options: options(SOURCE_KINDS, { publication: 'publication', dataset: 'unpublished dataset' })
		}),
		field('doi', 'text', { hint: 'e.g. 10.5555/12345678; look it up to fill the rest' }),
		field('pubmedId', 'text'),
		field('title', 'text', { required: true }),
		field('authors', 'textList', {
			required: true,
			hint: '"Family, Given", one per line'
		}),
		field('journal', 'text'),
		field('year', 'number'),
		field('note', 'textarea')
	],
	references: {},
	listFields: ['title', 'year', 'doi'],
	submissionTitle: (d) => (d.title.length > 80 ? `${d.title.slice(0, 77)}…` : d.title)
});
