import { z } from 'zod';
import { REFERENCE_ELECTRODES, toSHE } from '$lib/science/referenceElectrodes';
import { POTENTIAL_UNITS, potentialToMv } from '$lib/science/units';
import { STANDARD_TEMPERATURE_K } from '$lib/science/constants';
import { accessionField, noteField, phField, temperatureKField } from './fields';
import { POTENTIAL_METHODS } from './vocabulary';

/** A midpoint potential as reported by its source, with its conditions. */
export const potentialInputSchema = z.strictObject({
	centreAccession: accessionField,
	couple: z.string().trim().min(3).max(40),
	reportedValue: z.number().refine(Number.isFinite, 'expected a finite number'),
	reportedUnit: z.enum(POTENTIAL_UNITS),
	referenceElectrode: z.enum(REFERENCE_ELECTRODES),
	ph: phField.nullable().default(null),
	temperatureK: temperatureKField.nullable().default(null),
	ionicStrengthM: z.number().min(0).max(6).nullable().default(null),
	buffer: z.string().trim().max(120).nullable().default(null),
	method: z.enum(POTENTIAL_METHODS),
	nElectrons: z.number().int().min(1).max(4).default(1),
	uncertaintyMv: z.number().min(0).max(500).nullable().default(null),
	sourceAccession: accessionField.nullable().default(null),
	note: noteField
});

/** As stored in a version: the reported value plus its normalised form, fixed at write time. */
export const potentialSchema = potentialInputSchema.extend({
	emMvShe: z.number().min(-2000).max(2000)
});

export type PotentialInput = z.input<typeof potentialInputSchema>;
export type Potential = z.infer<typeof potentialSchema>;

/**
 * Adds the value normalised to mV vs SHE. The conversion runs at the reported temperature
 * (25 °C when none is given) and is frozen into the version, so a version never changes meaning.
 */
export function normalisePotential(input: z.infer<typeof potentialInputSchema>): Potential {
	const reportedMv = potentialToMv(input.reportedValue, input.reportedUnit);
	const emMvShe = toSHE(
		reportedMv,
		input.referenceElectrode,
		input.temperatureK ?? STANDARD_TEMPERATURE_K
	);
	return { ...input, emMvShe: Math.round(emMvShe * 10) / 10 };
}
