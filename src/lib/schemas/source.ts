import { z } from 'zod';
import { noteField } from './fields';
import { SOURCE_KINDS } from './vocabulary';

/** DOI syntax per the DOI Handbook §2.2: "10." prefix, registrant code, "/", suffix. */
export const DOI_PATTERN = /^10\.\d{4,9}\/\S+$/;

export const sourceSchema = z.strictObject({
	sourceKind: z.enum(SOURCE_KINDS),
	doi: z
		.string()
		.trim()
		.regex(DOI_PATTERN, 'expected a DOI such as 10.5555/12345678')
		.nullable()
		.default(null),
	pubmedId: z
		.string()
		.trim()
		.regex(/^\d{1,9}$/, 'a PubMed ID is digits only')
		.nullable()
		.default(null),
	title: z.string().trim().min(2).max(500),
	/** "Family, Given" per author, in the order published. */
	authors: z.array(z.string().trim().min(1).max(120)).min(1).max(200),
	journal: z.string().trim().max(200).nullable().default(null),
	year: z.number().int().min(1900).max(2100).nullable().default(null),
	note: noteField
});

export type Source = z.infer<typeof sourceSchema>;
