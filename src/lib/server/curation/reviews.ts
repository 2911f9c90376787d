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
import { setSubmissionStatus } from './submissions';
import { setImmediate } from 'node:timers/promises';
import { nextStatus, type SubmissionAction } from './transitions';
import { withRowPrefix } from './rowComment';
import { duringBulkWrite } from '../db/revision';

/*
 * A curator's side of curation: the decision on a submission and the comment thread. Approval
 * numbers and freezes each version, applies the visibility it asked for, updates the read model
 * and the search revision.
 *
 * Decisions take `db | trx` like every service. Given a transaction, the whole decision happens
 * in it. Given the database itself (as the review page does), approving runs in transactions of
 * APPROVAL_CHUNK_ROWS versions each, so that no other write waits long, and then one last
 * transaction records the outcome (the submission's state, returned rows, review, audit and the
 * mail to send). A crash in between leaves the approved versions approved and the others still
 * submitted, with the submission awaiting its decision: deciding again skips what is approved
 * and finishes. Every chunk re-checks that the submission still awaits a decision.
 */

/** Versions approved per write transaction: a few hundred milliseconds' work (0.7–3 ms a row). */
export const APPROVAL_CHUNK_ROWS = 200;
/**
 * Within a chunk the event loop is let go every so many rows, so that reads (on their own
 * connection) are answered within tens of milliseconds; writes wait for the chunk's commit.
 * Letting go is `await setImmediate()` (node:timers/promises), which goes round the event loop;
 * awaiting a resolved promise would not, as microtasks run before any I/O.
 */
const YIELD_EVERY = 50;

/** Runs `work` in the caller's transaction, or in a new one when given the database. */
function inTransaction<T>(
	db: Kysely<Database>,
	work: (trx: Kysely<Database>) => Promise<T>
): Promise<T> {
	return db.isTransaction ? work(db) : db.transaction().execute(work);
}

async function loadSubmission(trx: Kysely<Database>, submissionId: number) {
	const submission = await trx
		.selectFrom('submission')
		.selectAll()
		.where('id', '=', submissionId)
		.executeTakeFirst();
	if (!submission) throw new SubmissionNotFoundError(submissionId);
	return submission;
}

/** The actions of a curator's decision (a batch's is known only once its rows are). */
type DecisionAction = Extract<
	SubmissionAction,
	'approve' | 'approve_in_part' | 'return' | 'reject'
>;

/**
 * The submission a curator is about to decide on, checked to allow the decision (see
 * `SUBMISSION_TRANSITIONS`) and (four eyes) not to be the curator's own.
 */
async function loadForDecision(
	trx: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	action: DecisionAction
) {
	assertRole(curator, 'curator');
	const submission = await loadSubmission(trx, submissionId);
	nextStatus(submission.status, action, submissionId);
	if (submission.submitted_by === curator.id) {
		throw new SubmissionAccessError('another curator must review your own submission');
	}
	return submission;
}

/**
 * Approves versions in the order given (proteins of a batch before the centres naming them),
 * pausing every YIELD_EVERY rows so that other requests are served. A reference that does not
 * resolve is reported with the row and accession it belongs to.
 */
async function approveInOrder(
	trx: Kysely<Database>,
	curator: SessionUser,
	versions: readonly { id: number; accession: string; row_number: number | null }[],
	approvedAt: string
): Promise<void> {
	for (const [i, v] of versions.entries()) {
		if (i > 0 && i % YIELD_EVERY === 0) await setImmediate();
		try {
			await approveVersion(trx, v.id, { approvedBy: curator.id, approvedAt });
		} catch (e) {
			if (e instanceof InvalidEntryDataError) {
				const where = v.row_number ? `row ${v.row_number} (${v.accession})` : v.accession;
				throw new SubmissionInvalidError({ [e.field]: [`${where}: ${e.detail}`] });
			}
			throw e;
		}
	}
}

/**
 * Approves every still-submitted version of a submission except those listed, in order of id,
 * one chunk per transaction when given the database (see the top of this file). Versions
 * approved earlier (by an approval that was interrupted, or by another curator's at the same
 * time) are skipped, so running it again finishes the job.
 */
async function approvePending(
	db: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	except: ReadonlySet<number>,
	approvedAt: string
): Promise<void> {
	const approveAll = async () => {
		let after = 0;
		for (;;) {
			const last = await inTransaction(db, async (trx) => {
				await loadForDecision(trx, curator, submissionId, 'approve');
				const chunk = await trx
					.selectFrom('entry_version')
					.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
					.select(['entry_version.id', 'entry_version.row_number', 'entry.accession'])
					.where('entry_version.submission_id', '=', submissionId)
					.where('entry_version.status', '=', 'submitted')
					.where('entry_version.id', '>', after)
					.orderBy('entry_version.id')
					.limit(APPROVAL_CHUNK_ROWS)
					.execute();
				await approveInOrder(
					trx,
					curator,
					chunk.filter((v) => !except.has(v.id)),
					approvedAt
				);
				return chunk.at(-1)?.id ?? null;
			});
			if (last === null) return;
			after = last;
			// Other requests (and, with the database given, other writers) run between chunks.
			await setImmediate();
		}
	};
	// Committing chunk after chunk moves the catalogue revision each time (see revision.ts).
	await (db.isTransaction ? approveAll() : duringBulkWrite(approveAll));
}

/**
 * The approved versions of a submission, in order, for the outcome, its audit and its mail. A
 * submission awaiting a decision holds approved versions only from an approval not finished yet
 * (a partially approved batch never returns to review), so these are the decision's own.
 */
async function approvedVersions(trx: Kysely<Database>, submissionId: number) {
	return trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select(['entry.accession', 'entry_version.version'])
		.where('entry_version.submission_id', '=', submissionId)
		.where('entry_version.status', '=', 'approved')
		.orderBy('entry_version.id')
		.$narrowType<{ version: number }>()
		.execute();
}

export interface DecisionOutcome {
	approved: { accession: string; version: number }[];
	mails: OutgoingMail[];
}

export async function decideSubmission(
	db: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	decision: { decision: ReviewDecision; comment: string },
	origin: string
): Promise<DecisionOutcome> {
	// Refused before anything is written: not awaiting a decision, or the curator's own.
	await loadForDecision(db, curator, submissionId, decision.decision);
	const now = new Date().toISOString();
	if (decision.decision === 'approve') {
		await approvePending(db, curator, submissionId, new Set(), now);
	}
	return inTransaction(db, async (trx) => {
		const submission = await loadForDecision(trx, curator, submissionId, decision.decision);
		const status = nextStatus(submission.status, decision.decision, submissionId);
		let approved: DecisionOutcome['approved'] = [];
		if (decision.decision === 'approve') {
			await approvePending(trx, curator, submissionId, new Set(), now);
			approved = await approvedVersions(trx, submissionId);
			await trx
				.updateTable('submission')
				.set({ status, updated_at: now })
				.where('id', '=', submissionId)
				.execute();
		} else {
			const started = await approvedVersions(trx, submissionId);
			if (started.length > 0) {
				throw new SubmissionStateError(
					`${started.length} entr${started.length === 1 ? 'y' : 'ies'} of submission ${submissionId} ` +
						'were approved by an approval that has not finished; approve the submission to finish it' +
						(submission.channel === 'csv' ? ', or return the remaining rows row by row' : '')
				);
			}
			await setSubmissionStatus(
				trx,
				submissionId,
				status,
				decision.decision === 'return' ? 'returned' : 'rejected'
			);
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
			after: { status, approved },
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
	});
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
	nextStatus(submission.status, 'comment', submissionId);
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
 * Which rows of a batch to approve and which to return, checked before anything is written and
 * again in the transaction that records the outcome. A row approved already (by an approval
 * that was interrupted) can no longer be returned.
 */
async function planBatch(
	trx: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	decision: BatchDecision
) {
	// Every row is approved but those returned: the decision starts by approving; the state it
	// leads to (approved, partially approved, returned) is known once the rows are.
	const submission = await loadForDecision(trx, curator, submissionId, 'approve');
	const versions = await trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select([
			'entry_version.id',
			'entry_version.row_number',
			'entry_version.status',
			'entry.accession'
		])
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
	const returned = versions.filter((v) => v.row_number !== null && toReturn.has(v.row_number));
	const approvedAlready = returned.filter((v) => v.status === 'approved');
	if (approvedAlready.length > 0) {
		throw new SubmissionInvalidError({
			returnRows: [
				`row(s) ${approvedAlready.map((v) => v.row_number).join(', ')} were approved already, by an approval of this batch that has not finished, and can no longer be returned`
			]
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
	return { submission, returned, rowComments, toReturn };
}

interface BatchDecision {
	returnRows: number[];
	rowComments?: Record<number, string>;
	comment: string;
}

/**
 * A curator's decision on a CSV batch row by row: every row is approved except those listed to
 * return (by file row number), which go back to the contributor with the comment. The batch is
 * approved, partially approved, or returned when no row was approved.
 */
export async function decideBatch(
	db: Kysely<Database>,
	curator: SessionUser,
	submissionId: number,
	decision: BatchDecision,
	origin: string
): Promise<DecisionOutcome & { returned: number }> {
	const plan = await planBatch(db, curator, submissionId, decision);
	const now = new Date().toISOString();
	await approvePending(db, curator, submissionId, new Set(plan.returned.map((v) => v.id)), now);
	return inTransaction(db, async (trx) => {
		const { submission, returned, rowComments, toReturn } = await planBatch(
			trx,
			curator,
			submissionId,
			decision
		);
		const returnedIds = returned.map((v) => v.id);
		await approvePending(trx, curator, submissionId, new Set(returnedIds), now);
		const approved = await approvedVersions(trx, submissionId);
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
		const status = nextStatus(
			submission.status,
			returnedIds.length === 0 ? 'approve' : approved.length === 0 ? 'return' : 'approve_in_part',
			submissionId
		);
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
			after: {
				status,
				approved: approved.length,
				returnedRows: [...toReturn].sort((a, b) => a - b)
			},
			detail: decision.comment || null
		});
		const perRow = returned
			.map(
				(v) =>
					`  ${withRowPrefix(v.row_number as number, rowComments[v.row_number as number] ?? decision.comment)}`
			)
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
	});
}
