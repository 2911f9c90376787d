import type { Kysely } from 'kysely';
import type { Page } from '$lib/catalogue/dto';
import { encodeCursor } from '$lib/schemas/pagination';
import type { Database } from '../db/schema';
import { entryIsVisible, type Viewer } from './visibility';

/*
 * What the read-only lists share. The lists of each kind are in its module (src/lib/server/kinds);
 * potentials are listed from the search index (potentials.ts).
 */

/** One page of a list, with the cursor of the next page when there is one. */

export function pageOf<T>(items: T[], total: number, offset: number): Page<T> {
	const next = offset + items.length;
	return { items, total, nextCursor: next < total && items.length > 0 ? encodeCursor(next) : null };
}

/** Organisms present in the visible catalogue, for the organism facet. */
export async function listOrganisms(
	db: Kysely<Database>,
	viewer: Viewer | null
): Promise<string[]> {
	const rows = await db
		.selectFrom('protein as pr')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => entryIsVisible(eb, 'pe', viewer))
		.select('pr.organism')
		.distinct()
		.orderBy('pr.organism')
		.execute();
	return rows.map((r) => r.organism);
}
