import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/** The number of an entry's latest approved version, or null when none is approved yet. */
export async function latestApprovedVersionNumber(
	db: Kysely<Database>,
	entryId: number
): Promise<number | null> {
	const row = await db
		.selectFrom('entry_version')
		.select((eb) => eb.fn.max('version').as('latest'))
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.executeTakeFirst();
	return row?.latest ?? null;
}
