import type { Kysely, SelectQueryBuilder } from 'kysely';
import type { Database } from '../db/schema';
import type { SourceRefColumns } from './mappers';
import { entryIsVisible, type Viewer } from './visibility';

/*
 * What the read-only lists share. The lists of each kind are in its module (src/lib/server/kinds);
 * potentials are listed from the search index (potentials.ts).
 */

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

/**
 * Adds a listed row's source as the columns `toSourceRef` reads: null where there is none, and
 * null too where the reader may not see it (its DOI and authors would leak). `sourceEntryId` is
 * the row's `source_entry_id` column, qualified by its table's alias.
 */
export function withVisibleSource<DB, TB extends keyof DB, O>(
	query: SelectQueryBuilder<DB, TB, O>,
	sourceEntryId: `${string}.source_entry_id`,
	viewer: Viewer | null
): SelectQueryBuilder<DB, TB, O & SourceRefColumns> {
	// Kysely cannot follow joins added to a query of any tables; the result is typed above.
	const q = query as unknown as SelectQueryBuilder<
		Database & { listed: Database['potential'] },
		'listed',
		O
	>;
	return q
		.leftJoin('entry as se', (join) =>
			join
				.onRef('se.id', '=', sourceEntryId as 'listed.source_entry_id')
				.on((eb) => entryIsVisible(eb, 'se', viewer))
		)
		.leftJoin('source as s', 's.entry_id', 'se.id')
		.select([
			'se.accession as source_accession',
			's.doi as source_doi',
			's.year as source_year',
			's.authors as source_authors'
		]) as unknown as SelectQueryBuilder<DB, TB, O & SourceRefColumns>;
}
