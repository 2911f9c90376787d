import { STANDARD_TEMPERATURE_K } from '$lib/science/constants';
import {
	REFERENCE_ELECTRODES,
	REFERENCE_ELECTRODE_LABELS,
	describeTemperatureRange,
	electrodeTemperatureProblem
} from '$lib/science/referenceElectrodes';
import { POTENTIAL_UNITS } from '$lib/science/units';
import { normalisePotential, potentialInputSchema, potentialSchema } from '$lib/schemas/potential';
import {
	COUPLES_BY_KIND,
	POTENTIAL_METHODS,
	POTENTIAL_METHOD_LABELS
} from '$lib/schemas/vocabulary';
import { CENTRE_BY_NAME, columnsFromFields, withAlternative } from './csvColumns';
import { defineKind } from './kind';
import { TEMPERATURE_HINT, field, options, reference } from './formFields';

const EM_FIELD = potentialSchema.shape.emMvShe;

const ALL_COUPLES = [...new Set(Object.values(COUPLES_BY_KIND).flat())];

const FIELDS = [
	reference('centreAccession', 'centre', { required: true }),
	field('couple', 'text', {
		required: true,
		suggestions: ALL_COUPLES,
		hint: 'oxidised/reduced level, e.g. [4Fe-4S]2+/1+'
	}),
	field('reportedValue', 'number', { required: true, hint: 'as reported, before conversion' }),
	field('reportedUnit', 'select', { required: true, options: options(POTENTIAL_UNITS) }),
	field('referenceElectrode', 'select', {
		required: true,
		options: options(REFERENCE_ELECTRODES, REFERENCE_ELECTRODE_LABELS),
		hint: `converted to SHE at the temperature given: SCE ${describeTemperatureRange('SCE')}, Ag/AgCl ${describeTemperatureRange('AgAgCl_sat')} (a 25 °C offset), SHE and NHE at any temperature (NHE taken as SHE)`
	}),
	field('ph', 'number'),
	field('temperatureK', 'temperature', { unit: 'K', hint: TEMPERATURE_HINT }),
	field('ionicStrengthM', 'number', { unit: 'M' }),
	field('buffer', 'text'),
	field('method', 'select', {
		required: true,
		options: options(POTENTIAL_METHODS, POTENTIAL_METHOD_LABELS)
	}),
	field('nElectrons', 'number', { hint: '1 unless the couple is a two-electron one' }),
	field('uncertaintyMv', 'number', { unit: 'mV', hint: 'one standard uncertainty' }),
	reference('sourceAccession', 'source'),
	field('note', 'textarea')
];

export const potential = defineKind({
	label: 'Potential',
	schema: potentialSchema,
	// Sent as reported (value, unit, reference electrode); stored with the value vs SHE as well.
	input: {
		schema: potentialInputSchema,
		toData(input) {
			// Each electrode's conversion holds over a stated range of temperatures only
			// (referenceElectrodes.ts, TEMPERATURE_RANGES: the SCE law of Bard & Faulkner 2001,
			// Table C.2; Ag/AgCl 25 °C offsets within ±10 K, Sawyer et al. 1995, Table 5.1).
			const problem = electrodeTemperatureProblem(
				input.referenceElectrode,
				input.temperatureK ?? STANDARD_TEMPERATURE_K
			);
			if (problem !== null) {
				const fields: Record<string, string[]> = { temperatureK: [problem] };
				return { ok: false, fields };
			}
			const data = normalisePotential(input);
			if (EM_FIELD.safeParse(data.emMvShe).success) return { ok: true, data };
			// The contributor typed the reported value: the error belongs there, with the likely cause.
			return {
				ok: false,
				fields: {
					reportedValue: [
						`converts to ${data.emMvShe} mV vs SHE, outside ${EM_FIELD.minValue} to ${EM_FIELD.maxValue} mV; check the unit`
					]
				}
			};
		}
	},
	formFields: FIELDS,
	references: { centreAccession: 'centre', sourceAccession: 'source' },
	listFields: ['centreAccession', 'couple', 'emMvShe', 'ph', 'temperatureK', 'method'],
	upload: {
		label: 'Potentials',
		noun: 'potentials',
		derivedFields: { reportedValue: 'emMvShe' },
		columns: [
			// The unit and the electrode may instead ride in the value's header or cell: "(mV vs SCE)".
			...withAlternative(
				withAlternative(
					withAlternative(columnsFromFields(FIELDS), 'centreAccession', 'protein + centreLabel'),
					'reportedUnit',
					'a unit in the reportedValue header or cell'
				),
				'referenceElectrode',
				'"vs …" in the reportedValue header or cell'
			),
			...CENTRE_BY_NAME
		]
	},
	submissionTitle: (d) => `${d.couple} of ${d.centreAccession}`
});
