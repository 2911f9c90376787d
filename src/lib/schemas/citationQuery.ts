import { z } from 'zod';

/** A calendar date as YYYY-MM-DD, one that exists (no 2026-02-30). */
export const calendarDateSchema = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD')
	.refine((value) => {
		const [y, m, d] = value.split('-').map(Number);
		const date = new Date(Date.UTC(y ?? 0, (m ?? 1) - 1, d ?? 1));
		return date.getUTCFullYear() === y && date.getUTCMonth() + 1 === m && date.getUTCDate() === d;
	}, 'no such date');

/**
 * The query of a citation file (/e/HL000123/v2/cite.bib): `accessed`, the reader's local date,
 * which the entry page's links carry once the browser knows it. Without it the file names no
 * access date.
 */
export const citationFileQuerySchema = z.object({ accessed: calendarDateSchema.optional() });
