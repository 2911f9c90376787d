import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { PendingLimitError } from './errors';

/*
 * How many entry versions one contributor may have awaiting review at once (drafts, submitted,
 * returned). Without a bound, one account could fill the database (and the accession space)
 * with rows nobody will ever review.
 */

const PENDING_VERSION = ['draft', 'submitted', 'returned'] as const;
const OPEN_SUBMISSION = ['draft', 'submitted', 'returned', 'partially_approved'] as const;

export async function pendingRowCount(trx: Kysely<Database>, userId: string): Promise<number> {
	const row = await trx
		.selectFrom('entry_version')
		.innerJoin('submission', 'submission.id', 'entry_version.submission_id')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('submission.submitted_by', '=', userId)
		.where('submission.status', 'in', OPEN_SUBMISSION)
		.where('entry_version.status', 'in', PENDING_VERSION)
		.executeTakeFirstOrThrow();
	return Number(row.n);
}

/** @throws {PendingLimitError} when `adding` more rows would pass `limit`. */
export async function assertPendingRoom(
	trx: Kysely<Database>,
	userId: string,
	adding: number,
	limit: number
): Promise<void> {
	const pending = await pendingRowCount(trx, userId);
	if (pending + adding > limit) throw new PendingLimitError(pending, adding, limit);
}
