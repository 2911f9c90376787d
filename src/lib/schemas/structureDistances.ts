import { z } from 'zod';
import { structureIdField } from './fields';
import { DISTANCE_METHODS } from './vocabulary';

/*
 * The form fields of the structure steps after the upload: which kept file, how the distances
 * are labelled, the cutoff, and the centre confirmed for each group (`match.N`, '' for none).
 */
export const structurePlanSchema = z.object({
	/** The kept structure file: the attachment id the upload step answered with. */
	attachment: z.coerce
		.number({ error: 'upload the structure file again' })
		.int('upload the structure file again')
		.positive('upload the structure file again'),
	structureId: structureIdField,
	method: z.enum(DISTANCE_METHODS, { error: `expected one of ${DISTANCE_METHODS.join(', ')}` }),
	cutoffA: z.coerce
		.number({ error: 'the cutoff is a number of Å' })
		.min(3, 'the cutoff is at least 3 Å')
		.max(40, 'the cutoff is at most 40 Å')
		.default(25)
});

export type StructurePlanForm = z.infer<typeof structurePlanSchema>;
