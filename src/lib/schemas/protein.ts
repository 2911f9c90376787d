import { z } from 'zod';
import { noteField, structureIdField } from './fields';

/** UniProtKB accession format (uniprot.org/help/accession_numbers). */
const UNIPROT_PATTERN = /^([OPQ][0-9][A-Z0-9]{3}[0-9]|[A-NR-Z][0-9]([A-Z][A-Z0-9]{2}[0-9]){1,2})$/;

export const proteinSchema = z.strictObject({
	name: z.string().trim().min(2).max(200),
	organism: z.string().trim().min(2).max(200),
	uniprot: z
		.string()
		.trim()
		.regex(UNIPROT_PATTERN, 'expected a UniProtKB accession such as P69905')
		.nullable()
		.default(null),
	structureIds: z.array(structureIdField).max(50).default([]),
	description: noteField
});

export type Protein = z.infer<typeof proteinSchema>;
