import { z } from 'zod';
import { accessionField, noteField, temperatureKField } from './fields';
import { SPIN_METHODS } from './vocabulary';

export const spinRecordSchema = z.strictObject({
	centreAccession: accessionField,
	/** The oxidation level the record describes, e.g. [4Fe-4S]1+, Fe3+, Ni-C. */
	oxidationLevel: z.string().trim().min(1).max(40),
	spinS: z
		.number()
		.min(0)
		.max(5)
		.refine((s) => Number.isInteger(s * 2), 'spin S is a whole or half-whole number'),
	/** Principal g-values; one (isotropic), two (axial) or three (rhombic). */
	gValues: z.array(z.number().min(0.5).max(12)).max(3).default([]),
	temperatureK: temperatureKField.nullable().default(null),
	method: z.enum(SPIN_METHODS),
	sourceAccession: accessionField.nullable().default(null),
	note: noteField
});

export type SpinRecord = z.infer<typeof spinRecordSchema>;
