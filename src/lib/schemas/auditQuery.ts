import { z } from 'zod';
import { ACCESSION_HINT, ACCESSION_PATTERN } from './accession';
import { AUDIT_ACTION_AREAS, type AuditActionArea } from '$lib/catalogue/auditAreas';

/*
 * The audit log's filters (/audit): what kind of action, who, which entry or submission, a date
 * range, and the keyset cursor of the page. Shared by the page's form (the action choices) and
 * the server (parsing). Actions are stored as `area.verb`; a filter chooses an area.
 */

export { AUDIT_ACTION_AREAS, type AuditActionArea } from '$lib/catalogue/auditAreas';

const AREAS = Object.keys(AUDIT_ACTION_AREAS) as [AuditActionArea, ...AuditActionArea[]];

const isoDay = z
	.string()
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD')
	.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'not a calendar date');

/** A page cursor: the time and id of the last record shown (`2026-01-02T03:04:05.678Z~123`). */
const cursor = z
	.string()
	.trim()
	.regex(
		/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z~\d{1,12}$/,
		'a cursor from an "Older records" link'
	)
	.transform((s) => {
		const [at, id] = s.split('~') as [string, string];
		return { at, id: Number(id) };
	});

export const auditQuerySchema = z
	.strictObject({
		action: z.enum(AREAS, { error: `expected one of ${AREAS.join(', ')}` }).optional(),
		/** Part of a name or an e-mail address. */
		actor: z.string().trim().max(200).optional(),
		accession: z.string().trim().toUpperCase().regex(ACCESSION_PATTERN, ACCESSION_HINT).optional(),
		submission: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER).optional(),
		from: isoDay.optional(),
		to: isoDay.optional(),
		after: cursor.optional()
	})
	.refine((q) => !q.from || !q.to || q.from <= q.to, {
		path: ['to'],
		message: 'the end date comes before the start date'
	});

export type AuditQuery = z.output<typeof auditQuerySchema>;
