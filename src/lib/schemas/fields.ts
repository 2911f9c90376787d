import { z } from 'zod';
import { ACCESSION_HINT, ACCESSION_PATTERN } from './accession';

/* Field schemas shared by several entities: one definition of each rule. */

export const accessionField = z
	.string()
	.trim()
	.regex(ACCESSION_PATTERN, `expected ${ACCESSION_HINT}`);

export const noteField = z.string().trim().max(4000).nullable().default(null);

export const phField = z.number().min(0, 'pH must be 0–14').max(14, 'pH must be 0–14');

/** Temperatures at which proteins are measured: liquid helium (EPR) up to 400 K. */
export const temperatureKField = z
	.number()
	.min(1, 'temperature must be at least 1 K')
	.max(400, 'temperature must be at most 400 K');

export const structureIdField = z
	.string()
	.trim()
	.min(1)
	.max(40)
	.regex(/^[A-Za-z0-9_.:-]+$/, 'structure identifiers use letters, digits and _ . : - only');
