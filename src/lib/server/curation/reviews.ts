import type { Kysely } from 'kysely';
import type { ReviewDecision } from '$lib/schemas/submission';
import { assertRole, roleAtLeast, type SessionUser } from '../auth/roles';
import { writeAudit } from '../audit/log';
import type { Database } from '../db/schema';
import { approveVersion } from '../catalogue/entries';
import { InvalidEntryDataError } from '../catalogue/errors';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from './errors';
import { commentMail, outcomeMail } from './notices';
import type { OutgoingMail } from './outbox';
import { setSubmissionStatus, submissionVersions } from './submissions';
import { yieldToEventLoop } from '../eventLoop';

/** Approving a large batch pauses every so many rows so that other requests are served. */
const YIELD_EVERY = 100;

/**
 * A curator's side of curation: the decision on a submission and the comment thread. Approval
 * numbers and freezes each version, applies the visibility it asked for, updates the read model
 * and the search revision — all in the caller's transaction, so it happens whole or not at all.
 */

async function loadSubmission(trx: Kysely<Database>, submissionId: number) {
	const submission = await trx
		.selectFrom('submission')
		.selectAll()
		.where('id', '=', submissionId)
		.executeTakeFirst();
	if (!submission) throw new SubmissionNotFoundError(submissionId);
	return submission;
}

/**
 * The submission a curator is about to decide on, checked to await a decision and (four eyes)
 * not to be the curator's own.
 */
async function loadForDecision(trx: Kysely<Database>, curator: SessionUser, submissionId: number) {
	assertRole(curator, 'curator');
	const submission = await loadSubmission(trx, submissionId);
	if (submission.status !== 'submitted') {
		throw new SubmissionStateError(
			`submission ${submissionId} is ${submission.status}; only submitted ones await a decision`
		);
	}
	if (submission.submitted_by === curator.id) {
		throw new SubmissionAccessError('another curator must review your own submission');
	}
	return submission;
}

/**
 * Approves versions in the order given (proteins of a batch before the centres naming them),
 * pausing now and then so other requests are served. A reference that does not resolve is
 * reported with the row and accession it belongs to.
 */
async function approveInOrder(
	trx: Kysely<Database>,
	curator: SessionUser,
	versions: readonly { id: number; accession: string; row_number?: number | null }[],
	approvedAt: string
): Promise<DecisionOutcome['approved']> {
	const approved: DecisionOutcome['approved'] = [];
	for (const [i, v] of versions.entries()) {
		if (i > 0 && i % YIELD_EVERY === 0) await yieldToEventLoop();
		try {
			const { version } = await approveVersion(trx, v.id, { approvedBy: curator.id, approvedAt });
			approved.push({ accession: v.accession, version });
		} catch (e) {
			if (e instanceof InvalidEntryDataError) {
				const where = v.row_number ? `row ${v.row_number} (${v.accession})` : v.accession;
				throw new SubmissionInvalidError({ [e.field]: [`${where}: ${e.detail}`] });
			}
			throw e;
		}
	}
	return approved;
}

export interface DecisionOutcome {
	approved: { accession: string; version: number }[];
	mails: OutgoingMail[];
}

export async function decideSubmission(
	trx: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	decision: { decision: ReviewDecision; comment: string },
	origin: string
): Promise<DecisionOutcome> {
	const submission = await loadForDecision(trx, curator, submissionId);
	const now = new Date().toISOString();
	const approved =
		decision.decision === 'approve'
			? await approveInOrder(trx, curator, await submissionVersions(trx, submissionId), now)
			: [];
	if (decision.decision === 'approve') {
		await trx
			.updateTable('submission')
			.set({ status: 'approved', updated_at: now })
			.where('id', '=', submissionId)
			.execute();
	} else {
		const status = decision.decision === 'return' ? 'returned' : 'rejected';
		await setSubmissionStatus(trx, submissionId, status, status);
	}
	await trx
		.insertInto('review')
		.values({
			submission_id: submissionId,
			reviewer_id: curator.id,
			decision: decision.decision,
			comment: decision.comment || null
		})
		.execute();
	if (decision.comment) {
		await trx
			.insertInto('submission_comment')
			.values({
				submission_id: submissionId,
				entry_version_id: null,
				author_id: curator.id,
				body: decision.comment
			})
			.execute();
	}
	await writeAudit(trx, {
		actorId: curator.id,
		action: `review.${decision.decision}`,
		submissionId,
		before: { status: submission.status },
		after: {
			status:
				decision.decision === 'approve'
					? 'approved'
					: decision.decision === 'return'
						? 'returned'
						: 'rejected',
			approved
		},
		detail: decision.comment || null
	});
	const mails = await outcomeMail(
		trx,
		submission,
		decision.decision,
		decision.comment,
		origin,
		approved
	);
	return { approved, mails };
}

/** A comment on the thread of a submission, by its contributor or by a curator. */
export async function addComment(
	trx: Kysely<Database>,
	user: SessionUser,
	submissionId: number,
	body: string,
	origin: string
): Promise<{ mails: OutgoingMail[] }> {
	const submission = await loadSubmission(trx, submissionId);
	const isOwner = submission.submitted_by === user.id;
	if (!isOwner && !roleAtLeast(user.role, 'curator')) {
		throw new SubmissionAccessError('only the contributor and curators can comment here');
	}
	if (submission.status === 'withdrawn') {
		throw new SubmissionStateError(`submission ${submissionId} was withdrawn`);
	}
	await trx
		.insertInto('submission_comment')
		.values({ submission_id: submissionId, entry_version_id: null, author_id: user.id, body })
		.execute();
	await writeAudit(trx, { actorId: user.id, action: 'comment.add', submissionId, detail: body });
	return {
		mails: isOwner ? [] : await commentMail(trx, submission, user.name ?? user.email, body, origin)
	};
}

/**
 * A curator's decision on a CSV batch row by row: every row is approved except those listed to
 * return (by file row number), which go back to the contributor with the comment. The batch is
 * approved, partially approved, or returned when no row was approved.
 */
export async function decideBatch(
	trx: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	decision: { returnRows: number[]; rowComments?: Record<number, string>; comment: string },
	origin: string
): Promise<DecisionOutcome & { returned: number }> {
	const submission = await loadForDecision(trx, curator, submissionId);
	const versions = await trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select(['entry_version.id', 'entry_version.row_number', 'entry.accession'])
		.where('entry_version.submission_id', '=', submissionId)
		.orderBy('entry_version.id')
		.execute();
	const rowComments = decision.rowComments ?? {};
	// A row given its own comment is returned too.
	const toReturn = new Set([...decision.returnRows, ...Object.keys(rowComments).map(Number)]);
	const unknown = [...toReturn].filter((r) => !versions.some((v) => v.row_number === r));
	if (unknown.length > 0) {
		throw new SubmissionInvalidError({
			returnRows: [`no rows ${unknown.join(', ')} in this batch`]
		});
	}
	const uncommented = [...toReturn].filter((r) => !rowComments[r]);
	if (uncommented.length > 0 && decision.comment.trim().length < 3) {
		throw new SubmissionInvalidError({
			comment: [
				`say what needs changing in row(s) ${uncommented.join(', ')} here, or give each its own line below`
			]
		});
	}
	const now = new Date().toISOString();
	const approved = await approveInOrder(
		trx,
		curator,
		versions.filter((v) => v.row_number === null || !toReturn.has(v.row_number)),
		now
	);
	const returned = versions.filter((v) => v.row_number !== null && toReturn.has(v.row_number));
	const returnedIds = returned.map((v) => v.id);
	if (returnedIds.length > 0) {
		await trx
			.updateTable('entry_version')
			.set({ status: 'returned' })
			.where('id', 'in', returnedIds)
			.execute();
		await trx
			.insertInto('submission_comment')
			.values(
				returned.map((v) => ({
					submission_id: submissionId,
					entry_version_id: v.id,
					author_id: curator.id,
					body: rowComments[v.row_number as number] ?? decision.comment
				}))
			)
			.execute();
	}
	const status =
		returnedIds.length === 0
			? 'approved'
			: approved.length === 0
				? 'returned'
				: 'partially_approved';
	await trx
		.updateTable('submission')
		.set({ status, updated_at: now })
		.where('id', '=', submissionId)
		.execute();
	await trx
		.insertInto('review')
		.values({
			submission_id: submissionId,
			reviewer_id: curator.id,
			decision: returnedIds.length === 0 ? 'approve' : 'return',
			comment: decision.comment || null
		})
		.execute();
	await writeAudit(trx, {
		actorId: curator.id,
		action: `review.batch`,
		submissionId,
		before: { status: submission.status },
		after: { status, approved: approved.length, returnedRows: [...toReturn].sort((a, b) => a - b) },
		detail: decision.comment || null
	});
	const perRow = returned
		.map((v) => `  row ${v.row_number}: ${rowComments[v.row_number as number] ?? decision.comment}`)
		.join('\n');
	const comment =
		returnedIds.length > 0
			? `${approved.length} row(s) approved; ${returned.length} returned:\n${perRow}`
			: decision.comment;
	const mails = await outcomeMail(
		trx,
		submission,
		returnedIds.length === 0 ? 'approve' : 'return',
		comment,
		origin,
		approved.slice(0, 20)
	);
	return { approved, returned: returnedIds.length, mails };
}
