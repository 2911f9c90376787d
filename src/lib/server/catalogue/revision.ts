import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/**
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
