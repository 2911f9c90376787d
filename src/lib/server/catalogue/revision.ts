import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * The catalogue revision: a counter bumped, inside the writing transaction, by every change
 * to what searches can see. In-memory indexes compare it with the revision they were built at.
 */

export async function bumpCatalogueRevision(trx: Kysely<Database>): Promise<number> {
	const { revision } = await trx
		.updateTable('catalogue_state')
		.set((eb) => ({ revision: eb('revision', '+', 1) }))
		.where('id', '=', 1)
		.returning('revision')
		.executeTakeFirstOrThrow();
	return revision;
}

export async function readCatalogueRevision(db: Kysely<Database>): Promise<number> {
	const { revision } = await db
		.selectFrom('catalogue_state')
		.select('revision')
		.where('id', '=', 1)
		.executeTakeFirstOrThrow();
	return revision;
}

/**
 * Long jobs that move the revision over and over (a large approval commits a chunk every few
 * hundred milliseconds) run inside `duringBulkWrite`, so that in-memory indexes know to refresh
 * less often meanwhile (search/potentialIndex.ts). A count per process: it holds no user data.
 */
let bulkWrites = 0;

export async function duringBulkWrite<T>(work: () => Promise<T>): Promise<T> {
	bulkWrites++;
	try {
		return await work();
	} finally {
		bulkWrites--;
	}
}

export function bulkWriteInProgress(): boolean {
	return bulkWrites > 0;
}

/**
 * How long what a signed-out reader sees stays as it is: until the revision moves, or until
 * the next embargo ends (an entry turns public without a write), or until the next UTC
 * midnight (citations carry the date they were accessed) — whichever comes first.
 */
export interface CatalogueValidity {
	revision: number;
	/** Epoch milliseconds. */
	validUntil: number;
}

export async function nextEmbargoEnd(db: Kysely<Database>, now: Date): Promise<number | null> {
	const { until } = await db
		.selectFrom('entry')
		.select((eb) => eb.fn.min('embargo_until').as('until'))
		.where('visibility', '=', 'embargoed')
		.where('embargo_until', '>', now.toISOString())
		.executeTakeFirstOrThrow();
	return until === null ? null : Date.parse(until);
}

export function nextUtcMidnight(now: Date): number {
	return Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + 1);
}

/**
 * The validity of the catalogue as read now, remembered per process: one indexed read of the
 * revision per call, and a scan for the next embargo only when the revision has moved or the
 * remembered validity has run out.
 */
export function catalogueValidityReader(db: Kysely<Database>) {
	let known: CatalogueValidity | null = null;
	return async function currentValidity(now = new Date()): Promise<CatalogueValidity> {
		const revision = await readCatalogueRevision(db);
		if (known && known.revision === revision && now.getTime() < known.validUntil) return known;
		const embargoEnd = await nextEmbargoEnd(db, now);
		const midnight = nextUtcMidnight(now);
		known = {
			revision,
			validUntil: embargoEnd === null ? midnight : Math.min(embargoEnd, midnight)
		};
		return known;
	};
}
