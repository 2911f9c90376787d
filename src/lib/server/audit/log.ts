import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * The audit log: who did what, when, to which entry or submission, with the state before and
 * after. Written in the same transaction as the change it records, so neither exists without
 * the other.
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
			...(record.at ? { at: record.at } : {})
		})
		.execute();
}

export interface AuditFilter {
	action?: string;
	actorEmail?: string;
	accession?: string;
	submissionId?: number;
	before?: number;
	limit: number;
}

/** Newest first; `before` pages by id. */
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
			'entry.accession'
		])
		.orderBy('audit_log.id', 'desc')
		.limit(filter.limit + 1);
	if (filter.action) q = q.where('audit_log.action', 'like', `${filter.action}%`);
	if (filter.actorEmail) q = q.where('User.email', '=', filter.actorEmail.toLowerCase());
	if (filter.accession) q = q.where('entry.accession', '=', filter.accession);
	if (filter.submissionId) q = q.where('audit_log.submission_id', '=', filter.submissionId);
	if (filter.before) q = q.where('audit_log.id', '<', filter.before);
	const rows = await q.execute();
	const page = rows.slice(0, filter.limit);
	return {
		rows: page,
		nextBefore: rows.length > filter.limit ? (page.at(-1)?.id ?? null) : null
	};
}
