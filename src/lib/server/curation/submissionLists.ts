import type { Kysely } from 'kysely';
import { parseEntryData } from '$lib/schemas/entryData';
import type { EntryKind } from '$lib/kinds';
import type { SessionUser } from '../auth/roles';
import { readJson } from '../db/json';
import type { Database, SubmissionStatus } from '../db/schema';
import { viewerOf } from '../catalogue/visibility';
import { batchFlagCounts } from './batchRows';
import { warningsForVersion, type WarningAudience } from './checks';

/*
 * Lists of submissions: the curators' review queue and a contributor's own list, each row with
 * its kinds and its warning counts (a CSV batch's from the warnings stored with its rows, a
 * form's computed for the reader).
 */

export interface QueueFilter {
	status: SubmissionStatus;
	kind?: EntryKind;
	contributor?: string;
	flag?: 'warnings' | 'conflicts';
}

export interface QueueRow {
	id: number;
	title: string;
	status: SubmissionStatus;
	channel: string;
	kinds: EntryKind[];
	contributor: string;
	submittedAt: string | null;
	updatedAt: string;
	rangeWarnings: number;
	conflicts: number;
}

type SubmissionListRow = {
	id: number;
	title: string;
	status: SubmissionStatus;
	channel: string;
	submitted_at: string | null;
	updated_at: string;
	contributor: string | null;
};

function baseRow(s: SubmissionListRow) {
	return {
		id: s.id,
		title: s.title,
		status: s.status,
		channel: s.channel,
		contributor: s.contributor ?? 'unknown',
		submittedAt: s.submitted_at,
		updatedAt: s.updated_at
	};
}

async function summarise(
	db: Kysely<Database>,
	rows: SubmissionListRow[],
	audience: WarningAudience
): Promise<QueueRow[]> {
	const out: QueueRow[] = [];
	for (const s of rows) {
		if (s.channel === 'csv') {
			out.push({ ...(await batchFlagCounts(db, s.id)), ...baseRow(s) });
			continue;
		}
		const versions = await db
			.selectFrom('entry_version')
			.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
			.select(['entry.id as entryId', 'entry.kind', 'entry_version.data'])
			.where('entry_version.submission_id', '=', s.id)
			.execute();
		let rangeWarnings = 0;
		let conflicts = 0;
		for (const v of versions) {
			const warnings = await warningsForVersion(db, parseEntryData(v.kind, readJson(v.data)), {
				entryId: v.entryId,
				audience
			});
			rangeWarnings += warnings.filter((w) => w.kind === 'range').length;
			conflicts += warnings.filter((w) => w.kind === 'conflict').length;
		}
		out.push({
			...baseRow(s),
			kinds: [...new Set(versions.map((v) => v.kind))],
			rangeWarnings,
			conflicts
		});
	}
	return out;
}

/** Submissions with their contributor's address: what both lists start from. */
function submissionRows(db: Kysely<Database>) {
	return db
		.selectFrom('submission')
		.leftJoin('User', 'User.id', 'submission.submitted_by')
		.select([
			'submission.id',
			'submission.title',
			'submission.status',
			'submission.channel',
			'submission.submitted_at',
			'submission.updated_at',
			'User.email as contributor'
		]);
}

/** The review queue, oldest submission first, so nothing waits longest by accident. */
export async function listQueue(db: Kysely<Database>, filter: QueueFilter): Promise<QueueRow[]> {
	let q = submissionRows(db)
		.where('submission.status', '=', filter.status)
		.where('submission.channel', '!=', 'seed')
		.orderBy('submission.submitted_at', 'asc')
		.orderBy('submission.id', 'asc')
		.limit(200);
	if (filter.contributor)
		q = q.where('User.email', 'like', `%${filter.contributor.toLowerCase()}%`);
	if (filter.kind) {
		const kind = filter.kind;
		q = q.where((eb) =>
			eb.exists(
				eb
					.selectFrom('entry_version')
					.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
					.select('entry_version.id')
					.whereRef('entry_version.submission_id', '=', 'submission.id')
					.where('entry.kind', '=', kind)
			)
		);
	}
	const rows = await summarise(db, await q.execute(), 'curator');
	if (filter.flag === 'warnings') return rows.filter((r) => r.rangeWarnings > 0);
	if (filter.flag === 'conflicts') return rows.filter((r) => r.conflicts > 0);
	return rows;
}

/** A contributor's own submissions; their flags count only what the contributor may see. */
export async function listOwnSubmissions(db: Kysely<Database>, user: SessionUser) {
	const rows = await submissionRows(db)
		.where('submission.submitted_by', '=', user.id)
		.orderBy('submission.updated_at', 'desc')
		.limit(500)
		.execute();
	return summarise(db, rows, viewerOf(user));
}
