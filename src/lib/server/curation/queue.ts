import { sql, type Kysely } from 'kysely';
import { diffEntryData, type FieldChange } from '$lib/catalogue/diff';
import { parseEntryData } from '$lib/schemas/entryData';
import type { EntryKind, Visibility } from '$lib/schemas/vocabulary';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import type { Database, SubmissionStatus } from '../db/schema';
import { warningsForVersion, type VersionWarning, type WarningAudience } from './checks';
import { viewerOf } from '../catalogue/visibility';
import { SubmissionNotFoundError } from './errors';

/* Reading submissions: the curators' queue, a contributor's own list, one submission in full. */

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

/** A CSV batch's kinds and flags from the warnings stored when its file was checked. */
async function batchCounts(db: Kysely<Database>, submissionId: number) {
	const rows = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select((eb) => [
			'entry.kind',
			eb.fn.countAll<number>().as('n'),
			eb.fn
				.count<number>(sql`case when entry_version.warnings like '%typical range%' then 1 end`)
				.as('range'),
			eb.fn
				.count<number>(sql`case when entry_version.warnings like '%conflicts with%' then 1 end`)
				.as('conflicts')
		])
		.where('entry_version.submission_id', '=', submissionId)
		.groupBy('entry.kind')
		.execute();
	return {
		kinds: rows.map((r) => r.kind),
		rangeWarnings: rows.reduce((a, r) => a + Number(r.range), 0),
		conflicts: rows.reduce((a, r) => a + Number(r.conflicts), 0)
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
			out.push({ ...(await batchCounts(db, s.id)), ...baseRow(s) });
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
			const warnings = await warningsForVersion(db, parseEntryData(v.kind, JSON.parse(v.data)), {
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

export interface VersionView {
	versionId: number;
	entryId: number;
	accession: string;
	kind: EntryKind;
	status: string;
	data: Record<string, unknown>;
	changeNote: string | null;
	requestedVisibility: {
		visibility: Visibility;
		groupName: string | null;
		groupId: number | null;
		embargoUntil: string | null;
	} | null;
	current: { version: number; data: Record<string, unknown> } | null;
	changes: FieldChange[];
	/** The approved version the proposal started from, when a newer one has been approved since. */
	staleBase: { basedOn: number | null; latest: number } | null;
	warnings: VersionWarning[];
	approvedVersion: number | null;
}

/** The versions of a form submission, with what the page shows of each. */
function formVersionRows(db: Kysely<Database>, submissionId: number) {
	return db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.leftJoin('research_group', 'research_group.id', 'entry_version.group_id')
		.select([
			'entry_version.id',
			'entry_version.status',
			'entry_version.data',
			'entry_version.change_note',
			'entry_version.based_on_version',
			'entry_version.version',
			'entry_version.visibility',
			'entry_version.group_id',
			'entry_version.embargo_until',
			'research_group.name as groupName',
			'entry.id as entryId',
			'entry.kind',
			'entry.accession'
		])
		.where('entry_version.submission_id', '=', submissionId)
		.orderBy('entry_version.id')
		.execute();
}

/**
 * One submission in full for its contributor or a curator; null for anyone else (who must not
 * learn that it exists).
 */
export async function loadSubmissionView(
	db: Kysely<Database>,
	user: SessionUser,
	submissionId: number
) {
	const submission = await db
		.selectFrom('submission')
		.leftJoin('User', 'User.id', 'submission.submitted_by')
		.select([
			'submission.id',
			'submission.title',
			'submission.status',
			'submission.channel',
			'submission.submitted_by',
			'submission.created_at',
			'submission.submitted_at',
			'submission.updated_at',
			'User.email as contributorEmail',
			'User.name as contributorName'
		])
		.where('submission.id', '=', submissionId)
		.executeTakeFirst();
	if (!submission) throw new SubmissionNotFoundError(submissionId);
	const isCurator = roleAtLeast(user.role, 'curator');
	if (submission.submitted_by !== user.id && !isCurator)
		throw new SubmissionNotFoundError(submissionId);
	// Curators reviewing someone else's submission compare with every approved value; anyone
	// reading their own (curators included) only with what they may see.
	const audience: WarningAudience =
		isCurator && submission.submitted_by !== user.id ? 'curator' : viewerOf(user);

	// A CSV batch is read page by page (loadBatchRows), never whole here.
	const rows = submission.channel === 'csv' ? [] : await formVersionRows(db, submissionId);
	const versions: VersionView[] = [];
	for (const r of rows) {
		const entry = parseEntryData(r.kind, JSON.parse(r.data));
		const current = await db
			.selectFrom('entry_version')
			.select(['version', 'data'])
			.where('entry_id', '=', r.entryId)
			.where('status', '=', 'approved')
			.where('id', '!=', r.id)
			.orderBy('version', 'desc')
			.executeTakeFirst();
		const currentData = current ? (JSON.parse(current.data) as Record<string, unknown>) : null;
		const data = entry.data as unknown as Record<string, unknown>;
		versions.push({
			versionId: r.id,
			entryId: r.entryId,
			accession: r.accession,
			kind: r.kind,
			status: r.status,
			data,
			changeNote: r.change_note,
			requestedVisibility: r.visibility
				? {
						visibility: r.visibility,
						groupId: r.group_id,
						groupName: r.groupName,
						embargoUntil: r.embargo_until
					}
				: null,
			current:
				current && currentData ? { version: current.version as number, data: currentData } : null,
			changes: diffEntryData(currentData ?? {}, data),
			staleBase:
				current && r.status !== 'approved' && (current.version ?? 0) !== (r.based_on_version ?? 0)
					? { basedOn: r.based_on_version, latest: current.version as number }
					: null,
			warnings: await warningsForVersion(db, entry, {
				entryId: r.entryId,
				audience
			}),
			approvedVersion: r.version
		});
	}
	const comments = await db
		.selectFrom('submission_comment')
		.innerJoin('User', 'User.id', 'submission_comment.author_id')
		.leftJoin('entry_version', 'entry_version.id', 'submission_comment.entry_version_id')
		.select([
			'submission_comment.id',
			'submission_comment.body',
			'submission_comment.created_at',
			'entry_version.row_number',
			'User.email',
			'User.name',
			'User.role'
		])
		.where('submission_comment.submission_id', '=', submissionId)
		.orderBy('submission_comment.id')
		.execute();
	const reviews = await db
		.selectFrom('review')
		.innerJoin('User', 'User.id', 'review.reviewer_id')
		.select(['review.id', 'review.decision', 'review.comment', 'review.created_at', 'User.email'])
		.where('submission_id', '=', submissionId)
		.orderBy('review.id')
		.execute();
	return {
		submission: {
			id: submission.id,
			title: submission.title,
			status: submission.status,
			channel: submission.channel,
			isOwn: submission.submitted_by === user.id,
			contributor: submission.contributorName ?? submission.contributorEmail ?? 'unknown',
			contributorEmail: submission.contributorEmail,
			createdAt: submission.created_at,
			submittedAt: submission.submitted_at,
			updatedAt: submission.updated_at
		},
		versions,
		comments: comments.map((c) => ({
			id: c.id,
			// A comment on one row of a CSV batch says which row.
			body: c.row_number === null ? c.body : `Row ${c.row_number}: ${c.body}`,
			at: c.created_at,
			author: c.name ?? c.email ?? 'unknown',
			role: c.role
		})),
		reviews: reviews.map((r) => ({
			id: r.id,
			decision: r.decision,
			comment: r.comment,
			at: r.created_at,
			reviewer: r.email
		}))
	};
}

export type SubmissionView = Awaited<ReturnType<typeof loadSubmissionView>>;

export interface BatchRow {
	versionId: number;
	row: number | null;
	accession: string;
	kind: EntryKind;
	status: string;
	data: Record<string, unknown>;
	warnings: string[];
	comments: string[];
}

/** One page of a CSV batch's rows in file order; `flagged` keeps rows with warnings. */
export async function loadBatchRows(
	db: Kysely<Database>,
	submissionId: number,
	options: { offset: number; limit: number; flagged: boolean }
) {
	let q = db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.where('entry_version.submission_id', '=', submissionId);
	if (options.flagged) q = q.where('entry_version.warnings', 'is not', null);
	const total = Number(
		(await q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n
	);
	const rows = await q
		.select([
			'entry_version.id',
			'entry_version.row_number',
			'entry_version.status',
			'entry_version.data',
			'entry_version.warnings',
			'entry.accession',
			'entry.kind'
		])
		.orderBy('entry_version.row_number')
		.orderBy('entry_version.id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	const comments = await db
		.selectFrom('submission_comment')
		.select(['entry_version_id', 'body'])
		.where('submission_id', '=', submissionId)
		.where('entry_version_id', 'in', rows.length ? rows.map((r) => r.id) : [-1])
		.execute();
	const statuses = await db
		.selectFrom('entry_version')
		.select((eb) => ['status', eb.fn.countAll<number>().as('n')])
		.where('submission_id', '=', submissionId)
		.groupBy('status')
		.execute();
	return {
		total,
		statuses: Object.fromEntries(statuses.map((s) => [s.status, Number(s.n)])),
		rows: rows.map((r): BatchRow => ({
			versionId: r.id,
			row: r.row_number,
			accession: r.accession,
			kind: r.kind,
			status: r.status,
			data: JSON.parse(r.data) as Record<string, unknown>,
			warnings: r.warnings ? (JSON.parse(r.warnings) as string[]) : [],
			comments: comments.filter((c) => c.entry_version_id === r.id).map((c) => c.body)
		}))
	};
}

/**
 * The entry kind of a submission's versions (what its edit form reads).
 * @throws {SubmissionNotFoundError} when there is no such submission.
 */
export async function submissionKind(
	db: Kysely<Database>,
	submissionId: number
): Promise<EntryKind> {
	const row = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select('entry.kind')
		.where('entry_version.submission_id', '=', submissionId)
		.executeTakeFirst();
	if (!row) throw new SubmissionNotFoundError(submissionId);
	return row.kind;
}
