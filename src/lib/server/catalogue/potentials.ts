import { sql, type Kysely } from 'kysely';
import type { Page, PotentialDto } from '$lib/catalogue/dto';
import type { PotentialFilter, PotentialSort } from '$lib/schemas/catalogueQuery';
import { encodeCursor } from '$lib/schemas/pagination';
import type { Database } from '../db/schema';
import { toPotentialDto } from './mappers';
import { nullsLast } from './sortOrder';
import { resolveTextQuery } from './textMatch';
import { potentialIsVisible, type Viewer } from './visibility';

export interface ListOptions<S extends string> {
	sort?: S;
	order?: 'asc' | 'desc';
	limit: number;
	offset: number;
}

const SORT_COLUMNS: Record<Exclude<PotentialSort, 'relevance'>, string[]> = {
	accession: ['p.entry_id'],
	protein: ['p.protein_name', 'p.centre_label', 'p.couple'],
	centre: ['p.centre_label', 'p.protein_name'],
	kind: ['p.cofactor_kind', 'p.protein_name', 'p.centre_label'],
	couple: ['p.couple'],
	em: ['p.em_mv_she'],
	ph: ['p.ph'],
	temperature: ['p.temperature_k'],
	method: ['p.method']
};

/** The filtered, visible potentials (no sorting or paging yet), on the one read-model table. */
async function filteredPotentials(
	db: Kysely<Database>,
	filter: PotentialFilter,
	viewer: Viewer | null
) {
	const text = await resolveTextQuery(db, filter.q);
	let query = db.selectFrom('potential as p').where((eb) => potentialIsVisible(eb, 'p', viewer));
	if (text.kind === 'accession') {
		const a = text.accession;
		query = query.where((eb) =>
			eb.or([
				eb('p.accession', '=', a),
				eb('p.centre_accession', '=', a),
				eb('p.protein_accession', '=', a)
			])
		);
	}
	if (filter.kind?.length) query = query.where('p.cofactor_kind', 'in', filter.kind);
	if (filter.organism?.length) query = query.where('p.organism', 'in', filter.organism);
	if (filter.method?.length) query = query.where('p.method', 'in', filter.method);
	if (filter.emMin !== undefined) query = query.where('p.em_mv_she', '>=', filter.emMin);
	if (filter.emMax !== undefined) query = query.where('p.em_mv_she', '<=', filter.emMax);
	if (filter.phMin !== undefined) query = query.where('p.ph', '>=', filter.phMin);
	if (filter.phMax !== undefined) query = query.where('p.ph', '<=', filter.phMax);
	if (filter.tMin !== undefined) query = query.where('p.temperature_k', '>=', filter.tMin);
	if (filter.tMax !== undefined) query = query.where('p.temperature_k', '<=', filter.tMax);
	if (filter.protein) query = query.where('p.protein_accession', '=', filter.protein);
	if (filter.centre) query = query.where('p.centre_accession', '=', filter.centre);
	return { query, text };
}

/**
 * Potentials matching the catalogue filters, one page at a time, with the total count.
 * Text finds centres through the search index; everything else is filtered in SQL on the
 * denormalised potential read model, so a search reads one table.
 */
export async function listPotentials(
	db: Kysely<Database>,
	filter: PotentialFilter,
	options: ListOptions<PotentialSort>,
	viewer: Viewer | null
): Promise<Page<PotentialDto>> {
	const { query, text } = await filteredPotentials(db, filter, viewer);
	if (text.kind === 'centres' && text.ids.length === 0) {
		return { items: [], total: 0, nextCursor: null };
	}
	// Ranked centre ids join as a JSON array; its index orders results by relevance.
	const matched =
		text.kind === 'centres'
			? query.innerJoin(
					sql<{ key: number; value: number }>`json_each(${JSON.stringify(text.ids)})`.as('hit'),
					(join) => join.onRef('hit.value', '=', 'p.centre_entry_id')
				)
			: query;

	const { n } = await matched
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();

	const relevance = text.kind === 'centres';
	const sort =
		options.sort === 'relevance' || options.sort === undefined
			? relevance
				? 'relevance'
				: 'protein'
			: options.sort;
	const direction = options.order ?? 'asc';
	let rows = matched
		.leftJoin('source as s', 's.entry_id', 'p.source_entry_id')
		.leftJoin('entry as se', 'se.id', 'p.source_entry_id')
		.select([
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
			'p.organism',
			'se.accession as source_accession',
			's.doi as source_doi',
			's.year as source_year',
			's.authors as source_authors'
		]);
	if (sort === 'relevance') {
		rows = rows.orderBy(sql.ref('hit.key'), direction);
	} else {
		for (const column of SORT_COLUMNS[sort])
			rows = rows.orderBy(sql.ref(column), nullsLast(direction));
	}
	const items = await rows
		.orderBy('p.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();

	const total = Number(n);
	const next = options.offset + items.length;
	return {
		items: items.map(toPotentialDto),
		total,
		nextCursor: next < total && items.length > 0 ? encodeCursor(next) : null
	};
}
