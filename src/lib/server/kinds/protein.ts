import type { Kysely } from 'kysely';
import type { Page, ProteinDto } from '$lib/catalogue/dto';
import type { PROTEIN_SORTS, ProteinApiQuery } from '$lib/schemas/catalogueQuery';

import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { toProteinRef } from '../catalogue/mappers';
import { sqlKeyset, type ListOptions, type ListOrder } from '../catalogue/keyset';
import { resolveTextQuery } from '../catalogue/textMatch';
import { entryIsVisible, type Viewer } from '../catalogue/visibility';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { upsertReadModel, type KindOnServer } from './kind';
import type { JsonColumn } from '../db/json';

type ProteinSort = (typeof PROTEIN_SORTS)[number];

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

/** How the protein list is ordered, by each of its sorts (keyset paging: catalogue/keyset.ts). */
export const PROTEIN_ORDER: ListOrder<ProteinSort> = {
	list: 'proteins',
	id: 'pr.entry_id',
	defaultSort: 'name',
	sorts: {
		accession: [{ ref: 'pe.accession', type: 'text' }],
		name: [{ ref: 'pr.name', type: 'text' }],
		organism: [{ ref: 'pr.organism', type: 'text' }]
	}
};

/** The proteins a reader may see, filtered, sorted and paged, for pages and the API. */
export async function listProteins(
	db: Kysely<Database>,
	filter: Pick<ProteinApiQuery, 'q' | 'organism'>,
	options: ListOptions<ProteinSort>,
	viewer: Viewer | null
): Promise<Page<ProteinDto>> {
	const keyset = sqlKeyset(PROTEIN_ORDER, options);
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
	const { n, before } = await query
		.select((eb) => [eb.fn.countAll<number>().as('n'), keyset.rowsBefore().as('before')])
		.executeTakeFirstOrThrow();
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
				.as('centre_count'),
			...keyset.keyColumns()
		])
		.where(keyset.where())
		.orderBy(keyset.orderBy())
		.limit(keyset.limit)
		.offset(keyset.offset)
		.execute();
	if (keyset.restartsAtFirstPage(rows.length))
		return listProteins(db, filter, { ...options, cursor: undefined, offset: 0 }, viewer);
	const toItem = (r: (typeof rows)[number]): ProteinDto => ({
		...toProteinRef(r),
		version: r.version,
		uniprot: r.uniprot,
		structureIds: readJson(r.structure_ids),
		centreCount: Number(r.centre_count ?? 0),
		isDemo: r.is_demo === 1
	});
	return keyset.page(rows, toItem, Number(n), Number(before));
}
