import type { Kysely } from 'kysely';
import type { Database } from './schema';

/**
 * The catalogue revision: a counter bumped, inside the writing transaction, by every change
 * to what searches can see. In-memory indexes (server/search) compare it with the revision they
 * were built at. It lives beside the database rather than in server/catalogue because both the
 * writers (catalogue, curation) and the readers (search, the read cache) depend on it, and the
 * catalogue itself depends on search.
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
