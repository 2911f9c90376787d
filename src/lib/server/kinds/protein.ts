import { sql, type Kysely } from 'kysely';
import type { Page, ProteinDto } from '$lib/catalogue/dto';
import type { ProteinApiQuery } from '$lib/schemas/catalogueQuery';

import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { pageOf } from '../catalogue/lists';
import { toProteinRef } from '../catalogue/mappers';
import type { ListOptions } from '../catalogue/potentials';
import { nullsLast } from '../catalogue/sortOrder';
import { resolveTextQuery } from '../catalogue/textMatch';
import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { upsertReadModel, type KindOnServer } from './kind';
import type { JsonColumn } from '../db/json';

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface ProteinTable {
	entry_id: number;
	version: number;
	name: string;
	organism: string;
	uniprot: string | null;
	/** JSON array of structure identifiers. */
	structure_ids: JsonColumn<string[]>;
	revision: number;
}

declare module '../db/schema' {
	interface KindTables {
		protein: ProteinTable;
	}
}

export const protein: KindOnServer<'protein'> = {
	async project(trx, { entryId, version, revision, data: d }) {
		await upsertReadModel(trx, 'protein', entryId, {
			version,
			name: d.name,
			organism: d.organism,
			uniprot: d.uniprot,
			structure_ids: JSON.stringify(d.structureIds),
			revision
		});
		// Centres carry their protein's name in the search index, potentials in their rows.
		await trx
			.updateTable('centre')
			.set({ revision })
			.where('protein_entry_id', '=', entryId)
			.execute();
		await refreshPotentialRows(trx, { column: 'protein_entry_id', entryId });
	},
	dependsOn: async () => [],
	title: (d) => d.name,
	potentialRowsColumn: 'protein_entry_id'
};

/** The proteins a reader may see, filtered, sorted and paged, for pages and the API. */
export async function listProteins(
	db: Kysely<Database>,
	filter: Pick<ProteinApiQuery, 'q' | 'organism'>,
	options: ListOptions<'accession' | 'name' | 'organism'>,
	viewer: Viewer | null
): Promise<Page<ProteinDto>> {
	const text = await resolveTextQuery(db, filter.q);
	let query = db
		.selectFrom('protein as pr')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => entryIsVisible(eb, 'pe', viewer));
	if (text.kind === 'accession') query = query.where('pe.accession', '=', text.accession);
	if (text.kind === 'centres') {
		const ids = text.ids.length > 0 ? text.ids : [-1];
		// Only centres the reader may see can bring their protein into the answer.
		query = query.where('pr.entry_id', 'in', (eb) =>
			eb
				.selectFrom('centre as tc')
				.innerJoin('entry as tce', 'tce.id', 'tc.entry_id')
				.select('tc.protein_entry_id')
				.where('tc.entry_id', 'in', ids)
				.where((e2) => entryIsVisible(e2, 'tce', viewer))
		);
	}
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	const { n } = await query
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const column = { accession: 'pe.accession', name: 'pr.name', organism: 'pr.organism' }[
		options.sort ?? 'name'
	];
	const rows = await query
		.select((eb) => [
			'pe.accession as protein_accession',
			'pr.name as protein_name',
			'pr.organism',
			'pr.version',
			'pr.uniprot',
			'pr.structure_ids',
			'pe.is_demo',
			eb
				.selectFrom('centre as cc')
				.innerJoin('entry as cce', 'cce.id', 'cc.entry_id')
				.select((e2) => e2.fn.countAll<number>().as('c'))
				.whereRef('cc.protein_entry_id', '=', 'pr.entry_id')
				.where((e2) => entryIsVisible(e2, 'cce', viewer))
				.as('centre_count')
		])
		.orderBy(sql.ref(column), nullsLast(options.order ?? 'asc'))
		.orderBy('pr.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	const items = rows.map((r): ProteinDto => ({
		...toProteinRef(r),
		version: r.version,
		uniprot: r.uniprot,
		structureIds: readJson(r.structure_ids),
		centreCount: Number(r.centre_count ?? 0),
		isDemo: r.is_demo === 1
	}));
	return pageOf(items, Number(n), options.offset);
}
