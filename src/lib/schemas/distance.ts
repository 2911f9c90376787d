import { z } from 'zod';
import { accessionField, noteField, structureIdField } from './fields';
import { DISTANCE_METHODS } from './vocabulary';

export const distanceSchema = z
	.strictObject({
		centreAAccession: accessionField,
		centreBAccession: accessionField,
		edgeToEdgeA: z.number().min(0).max(100),
		centreToCentreA: z.number().min(0).max(150).nullable().default(null),
		structureId: structureIdField,
		method: z.enum(DISTANCE_METHODS),
		sourceAccession: accessionField.nullable().default(null),
		note: noteField
	})
	.refine((d) => d.centreAAccession !== d.centreBAccession, {
		path: ['centreBAccession'],
		message: 'a distance joins two different centres'
	})
	.refine((d) => d.centreToCentreA === null || d.centreToCentreA >= d.edgeToEdgeA, {
		path: ['centreToCentreA'],
		message: 'the centre-to-centre distance cannot be shorter than the edge-to-edge distance'
	});

export type Distance = z.infer<typeof distanceSchema>;
