import type { Kysely } from 'kysely';
import { diffEntryData } from '$lib/catalogue/diff';
import type { SubmissionView, VersionView } from '$lib/schemas/curationResponses';
import { parseEntryData } from '$lib/schemas/entryData';
import type { EntryKind } from '$lib/kinds';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { viewerOf } from '../catalogue/visibility';
import { warningsForVersion, type WarningAudience } from './checks';
import { SubmissionNotFoundError } from './errors';
import { withRowPrefix } from './rowComment';

/*
 * One submission as its contributor or a curator reads it: its versions with the differences
 * from the approved one and their warnings, its comments and reviews. A CSV batch's rows are
 * read a page at a time (`batchRows.ts`).
 */

export type { SubmissionView, VersionView } from '$lib/schemas/curationResponses';

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
): Promise<SubmissionView> {
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
		const entry = parseEntryData(r.kind, readJson(r.data));
		const current = await db
			.selectFrom('entry_version')
			.select(['version', 'data'])
			.where('entry_id', '=', r.entryId)
			.where('status', '=', 'approved')
			.where('id', '!=', r.id)
			.orderBy('version', 'desc')
			.executeTakeFirst();
		const currentData = current ? readJson(current.data) : null;
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
			body: c.row_number === null ? c.body : withRowPrefix(c.row_number, c.body),
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
