import { spinRecordSchema } from '$lib/schemas/spinRecord';
import { SPIN_METHODS, SPIN_METHOD_LABELS } from '$lib/schemas/vocabulary';
import { CENTRE_BY_NAME, EXAMPLE_ROW_NOTE, columnsFromFields, withAlternative } from './csvColumns';
import { defineKind } from './kind';
import { TEMPERATURE_HINT, field, options, reference } from './formFields';

const FIELDS = [
	reference('centreAccession', 'centre', { required: true }),
	field('oxidationLevel', 'text', { required: true, hint: 'e.g. [4Fe-4S]1+ or Fe3+' }),
	field('spinS', 'number', { required: true, hint: 'whole or half-whole, e.g. 1/2 as 0.5' }),
	field('gValues', 'numberList', { hint: 'one, two or three principal values' }),
	field('temperatureK', 'temperature', { unit: 'K', hint: TEMPERATURE_HINT }),
	field('method', 'select', {
		required: true,
		options: options(SPIN_METHODS, SPIN_METHOD_LABELS)
	}),
	reference('sourceAccession', 'source'),
	field('note', 'textarea')
];

export const spinRecord = defineKind({
	label: 'Spin record',
	schema: spinRecordSchema,
	formFields: FIELDS,
	references: { centreAccession: 'centre', sourceAccession: 'source' },
	listFields: ['centreAccession', 'oxidationLevel', 'spinS', 'gValues', 'method'],
	upload: {
		label: 'Spin records',
		noun: 'spin records',
		columns: [
			...withAlternative(
				columnsFromFields(FIELDS, {
					method: 'cw_epr_x',
					temperatureK: '10',
					note: EXAMPLE_ROW_NOTE
				}),
				'centreAccession',
				'protein + centreLabel'
			),
			...CENTRE_BY_NAME
		]
	},
	submissionTitle: (d) => `${d.oxidationLevel} of ${d.centreAccession}`
});
