import { sql, type Kysely } from 'kysely';
import type { AuditActionArea } from '$lib/schemas/auditQuery';
import type { Database } from '../db/schema';

/*
 * The audit log: who did what, when, to which entry or submission, with the state before and
 * after. Written in the same transaction as the change it records, so neither exists without
 * the other. Read newest first by (at, id): every time is written in one form (toISOString, to
 * the millisecond; migration 0012 rewrote older ones), so text order is time order, and records
 * of the same millisecond keep the order they were written in.
 */
export interface AuditRecord {
	actorId: string | null;
	action: string;
	entryId?: number | null;
	submissionId?: number | null;
	before?: unknown;
	after?: unknown;
	detail?: string | null;
	at?: string;
}

/** A record's time in the log's one written form, or a RangeError for text that is no time. */
export function auditTime(at: string | Date): string {
	return (at instanceof Date ? at : new Date(at)).toISOString();
}

export async function writeAudit(trx: Kysely<Database>, record: AuditRecord): Promise<void> {
	await trx
		.insertInto('audit_log')
		.values({
			actor_id: record.actorId,
			action: record.action,
			entry_id: record.entryId ?? null,
			submission_id: record.submissionId ?? null,
			before: record.before === undefined ? null : JSON.stringify(record.before),
			after: record.after === undefined ? null : JSON.stringify(record.after),
			detail: record.detail ?? null,
			at: auditTime(record.at ?? new Date())
		})
		.execute();
}

export interface AuditFilter {
	/** An area of actions (the part before the dot). */
	action?: AuditActionArea;
	/** Part of the actor's name or e-mail address, any case. */
	actor?: string;
	accession?: string;
	submissionId?: number;
	/** First and last day (UTC, YYYY-MM-DD), both included. */
	from?: string;
	to?: string;
	/** The last record of the page before: older records follow it. */
	after?: { at: string; id: number };
	limit: number;
}

/** The day after a YYYY-MM-DD day, as the start of that day in the log's time form. */
const dayAfter = (day: string) =>
	new Date(Date.parse(`${day}T00:00:00.000Z`) + 86_400_000).toISOString();

/** Newest first, a page at a time (keyset on at, id). */
export async function listAudit(db: Kysely<Database>, filter: AuditFilter) {
	let q = db
		.selectFrom('audit_log')
		.leftJoin('User', 'User.id', 'audit_log.actor_id')
		.leftJoin('entry', 'entry.id', 'audit_log.entry_id')
		.select([
			'audit_log.id',
			'audit_log.at',
			'audit_log.action',
			'audit_log.submission_id as submissionId',
			'audit_log.before',
			'audit_log.after',
			'audit_log.detail',
			'User.email as actorEmail',
			'User.name as actorName',
			'entry.accession',
			'entry.kind'
		])
		.orderBy('audit_log.at', 'desc')
		.orderBy('audit_log.id', 'desc')
		.limit(filter.limit + 1);
	if (filter.action) q = q.where('audit_log.action', 'like', `${filter.action}.%`);
	if (filter.actor) {
		const text = filter.actor.toLowerCase();
		q = q.where(
			sql<boolean>`(instr(lower(${sql.ref('User.email')}), ${text}) > 0 or instr(lower(coalesce(${sql.ref('User.name')}, '')), ${text}) > 0)`
		);
	}
	if (filter.accession) q = q.where('entry.accession', '=', filter.accession);
	if (filter.submissionId) q = q.where('audit_log.submission_id', '=', filter.submissionId);
	if (filter.from) q = q.where('audit_log.at', '>=', `${filter.from}T00:00:00.000Z`);
	if (filter.to) q = q.where('audit_log.at', '<', dayAfter(filter.to));
	const after = filter.after;
	if (after) {
		q = q.where((eb) =>
			eb.or([
				eb('audit_log.at', '<', after.at),
				eb.and([eb('audit_log.at', '=', after.at), eb('audit_log.id', '<', after.id)])
			])
		);
	}
	const rows = await q.execute();
	const page = rows.slice(0, filter.limit);
	const last = page.at(-1);
	return {
		rows: page,
		next: rows.length > filter.limit && last ? `${last.at}~${last.id}` : null
	};
}
