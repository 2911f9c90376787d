import type { Kysely } from 'kysely';
import type { Page, PotentialDto } from '$lib/catalogue/dto';
import type { PotentialSort } from '$lib/catalogue/searchTable';
import type { PotentialFilter } from '$lib/schemas/catalogueQuery';
import type { Database } from '../db/schema';
import { withVisibleSource } from './lists';
import { toPotentialDto } from './mappers';
import { accessionNumber } from '$lib/schemas/accession';
import { potentialIndex, type IndexQuery } from '../search/potentialIndex';
import { pageWithCursors, positionOf, type KeyColumn, type ListOptions } from './keyset';
import { resolvePotentialText } from './textMatch';
import { potentialIsVisible, potentialRowVisibility, type Viewer } from './visibility';

/**
 * The sort keys of the potentials list as the index compares them (search/potentialIndex.ts:
 * `keyOf`), by sort; a cursor's key must fit its sort's shape. The refs only name the columns.
 */
export const POTENTIAL_KEYS: Record<PotentialSort, KeyColumn[]> = {
	accession: [],
	em: [{ ref: 'em_mv_she', type: 'number' }],
	ph: [{ ref: 'ph', type: 'number', nullable: true }],
	temperature: [{ ref: 'temperature_k', type: 'number', nullable: true }],
	protein: [
		{ ref: 'protein_name', type: 'text' },
		{ ref: 'centre_label', type: 'text' },
		{ ref: 'couple', type: 'text' }
	],
	centre: [
		{ ref: 'centre_label', type: 'text' },
		{ ref: 'protein_name', type: 'text' }
	],
	kind: [
		{ ref: 'cofactor_kind', type: 'text' },
		{ ref: 'protein_name', type: 'text' },
		{ ref: 'centre_label', type: 'text' }
	],
	couple: [{ ref: 'couple', type: 'text' }],
	method: [{ ref: 'method', type: 'text' }],
	/** The text search's score of the row's centre, and the centre's id. */
	relevance: [
		{ ref: 'score', type: 'number' },
		{ ref: 'centre_entry_id', type: 'number' }
	]
};

/** The columns of a potential row as lists and exports hand them to `toPotentialDto`. */
export async function readPotentialRows(
	db: Kysely<Database>,
	ids: readonly number[],
	viewer: Viewer | null
): Promise<PotentialDto[]> {
	if (ids.length === 0) return [];
	const rows = await db
		.selectFrom('potential as p')
		.$call((q) => withVisibleSource(q, 'p.source_entry_id', viewer))
		.select([
			'p.entry_id',
			'p.accession',
			'p.version',
			'p.couple',
			'p.em_mv_she',
			'p.reported_value',
			'p.reported_unit',
			'p.reference_electrode',
			'p.ph',
			'p.temperature_k',
			'p.ionic_strength_m',
			'p.buffer',
			'p.method',
			'p.n_electrons',
			'p.uncertainty_mv',
			'p.is_demo',
			'p.centre_accession',
			'p.centre_label',
			'p.cofactor_kind',
			'p.protein_accession',
			'p.protein_name',
			'p.organism'
		])
		.where('p.entry_id', 'in', ids)
		// The index already applied visibility; the rule is applied again where rows leave the database.
		.where((eb) => potentialIsVisible(eb, 'p', viewer))
		.execute();
	const byId = new Map(rows.map((r) => [r.entry_id, r]));
	return ids.flatMap((id) => {
		const row = byId.get(id);
		return row ? [toPotentialDto(row)] : [];
	});
}

/** What a potentials query asks the index, and the sort it is answered in. */
export interface PotentialSearch {
	query: Omit<IndexQuery, 'limit' | 'offset' | 'after' | 'before'>;
	/** The sort actually applied: relevance only with words to rank by, else by protein. */
	sort: PotentialSort;
}

/**
 * Resolves the text of a filter (for this reader: sources they may not see match nothing) and
 * the sort it will be answered in. The text restricts the rows in every sort; relevance ranks
 * by it.
 */
export async function potentialSearch(
	db: Kysely<Database>,
	filter: PotentialFilter,
	sort: PotentialSort | undefined,
	order: 'asc' | 'desc',
	viewer: Viewer | null
): Promise<PotentialSearch> {
	const { q, ...filters } = filter;
	const text = await resolvePotentialText(db, q, viewer);
	const relevance = text.kind === 'terms';
	const applied =
		sort === undefined || sort === 'relevance' ? (relevance ? 'relevance' : 'protein') : sort;
	return {
		sort: applied,
		query: {
			filter: filters,
			accession:
				text.kind === 'accession' ? (accessionNumber(text.accession) ?? undefined) : undefined,
			text: text.kind === 'terms' ? text.terms : undefined,
			sort: applied,
			order
		}
	};
}

/**
 * Potentials matching the catalogue filters, one page at a time, with the total count.
 * Text finds centres through the text index; filters, counts and sorting run on the in-memory
 * columns of the potential read model; SQLite then returns the rows of the page.
 */
export async function listPotentials(
	db: Kysely<Database>,
	filter: PotentialFilter,
	options: ListOptions<PotentialSort>,
	viewer: Viewer | null
): Promise<Page<PotentialDto>> {
	const order = options.order ?? 'asc';
	const search = await potentialSearch(db, filter, options.sort, order, viewer);
	const position = positionOf(
		'potentials',
		search.sort,
		order,
		POTENTIAL_KEYS[search.sort],
		options
	);
	const meta = { list: 'potentials', sort: search.sort, order };
	await potentialIndex.ensureCurrent(db);
	const found = potentialIndex.query(
		{
			...search.query,
			limit: options.limit,
			offset: position.kind === 'offset' ? position.offset : undefined,
			after: position.kind === 'after' ? position.key : undefined,
			before: position.kind === 'before' ? position.key : undefined
		},
		potentialRowVisibility(viewer)
	);
	const items = await readPotentialRows(db, found.page, viewer);
	return pageWithCursors(meta, items, found, found.total, found.offset);
}
