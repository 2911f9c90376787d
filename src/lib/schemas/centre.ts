import { z } from 'zod';
import { accessionField, noteField } from './fields';
import { COFACTOR_KINDS } from './vocabulary';

export const centreSchema = z.strictObject({
	proteinAccession: accessionField,
	label: z.string().trim().min(1).max(40),
	cofactorKind: z.enum(COFACTOR_KINDS),
	/** Ligand set in the trade's shorthand, e.g. Cys4, Cys3His, Cys2His2, His2Met. */
	ligation: z
		.string()
		.trim()
		.max(40)
		.regex(/^[A-Za-z0-9,()+\- ]*$/, 'ligation uses residue names and counts, e.g. Cys3His')
		.nullable()
		.default(null),
	chainId: z.string().trim().min(1).max(4).nullable().default(null),
	residues: z.array(z.number().int().min(-999).max(99_999)).max(20).default([]),
	/** Metal (or ring) centroid in the structure's frame, Å. */
	coordinatesA: z
		.strictObject({ x: z.number(), y: z.number(), z: z.number() })
		.nullable()
		.default(null),
	note: noteField
});

export type Centre = z.infer<typeof centreSchema>;
