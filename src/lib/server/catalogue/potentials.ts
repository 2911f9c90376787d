import { sql, type Kysely } from 'kysely';
import type { Page, PotentialDto } from '$lib/catalogue/dto';
import type { PotentialFilter, PotentialSort } from '$lib/schemas/catalogueQuery';
import { encodeCursor } from '$lib/schemas/pagination';
import type { Database } from '../db/schema';
import { toPotentialDto } from './mappers';
import { nullsLast } from './sortOrder';
import { resolveTextQuery } from './textMatch';
import { entryIsVisible, type Viewer } from './visibility';

export interface ListOptions<S extends string> {
	sort?: S;
	order?: 'asc' | 'desc';
	limit: number;
	offset: number;
}

const SORT_COLUMNS: Record<Exclude<PotentialSort, 'relevance'>, string[]> = {
	accession: ['e.accession'],
	protein: ['pr.name', 'c.label', 'p.couple'],
	centre: ['c.label', 'pr.name'],
	kind: ['c.cofactor_kind', 'pr.name', 'c.label'],
	couple: ['p.couple'],
	em: ['p.em_mv_she'],
	ph: ['p.ph'],
	temperature: ['p.temperature_k'],
	method: ['p.method']
};

function baseQuery(db: Kysely<Database>, viewer: Viewer | null) {
	return db
		.selectFrom('potential as p')
		.innerJoin('entry as e', 'e.id', 'p.entry_id')
		.innerJoin('centre as c', 'c.entry_id', 'p.centre_entry_id')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) =>
			eb.and([
				entryIsVisible(eb, 'e', viewer),
				entryIsVisible(eb, 'ce', viewer),
				entryIsVisible(eb, 'pe', viewer)
			])
		);
}

/**
 * Potentials matching the catalogue filters, one page at a time, with the total count.
 * Text finds centres through the search index; everything else is filtered in SQL.
 */
export async function listPotentials(
	db: Kysely<Database>,
	filter: PotentialFilter,
	options: ListOptions<PotentialSort>,
	viewer: Viewer | null
): Promise<Page<PotentialDto>> {
	const text = await resolveTextQuery(db, filter.q);
	if (text.kind === 'centres' && text.ids.length === 0) {
		return { items: [], total: 0, nextCursor: null };
	}

	let query = baseQuery(db, viewer);
	if (text.kind === 'accession') {
		const a = text.accession;
		query = query.where((eb) =>
			eb.or([eb('e.accession', '=', a), eb('ce.accession', '=', a), eb('pe.accession', '=', a)])
		);
	}
	if (filter.kind?.length) query = query.where('c.cofactor_kind', 'in', filter.kind);
	if (filter.organism?.length) query = query.where('pr.organism', 'in', filter.organism);
	if (filter.method?.length) query = query.where('p.method', 'in', filter.method);
	if (filter.emMin !== undefined) query = query.where('p.em_mv_she', '>=', filter.emMin);
	if (filter.emMax !== undefined) query = query.where('p.em_mv_she', '<=', filter.emMax);
	if (filter.phMin !== undefined) query = query.where('p.ph', '>=', filter.phMin);
	if (filter.phMax !== undefined) query = query.where('p.ph', '<=', filter.phMax);
	if (filter.tMin !== undefined) query = query.where('p.temperature_k', '>=', filter.tMin);
	if (filter.tMax !== undefined) query = query.where('p.temperature_k', '<=', filter.tMax);
	if (filter.protein) query = query.where('pe.accession', '=', filter.protein);
	if (filter.centre) query = query.where('ce.accession', '=', filter.centre);

	// Ranked centre ids join as a JSON array; its index orders results by relevance.
	const ranked =
		text.kind === 'centres'
			? query.innerJoin(
					sql<{ key: number; value: number }>`json_each(${JSON.stringify(text.ids)})`.as('hit'),
					(join) => join.onRef('hit.value', '=', 'p.centre_entry_id')
				)
			: null;

	const counted = await (ranked ?? query)
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();

	const sort = options.sort === 'relevance' && !ranked ? 'protein' : (options.sort ?? (ranked ? 'relevance' : 'protein'));
	const direction = options.order ?? 'asc';
	let page = (ranked ?? query).leftJoin('source as s', 's.entry_id', 'p.source_entry_id')
		.leftJoin('entry as se', 'se.id', 'p.source_entry_id')
		.select([
			'e.accession',
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
			'e.is_demo',
			'ce.accession as centre_accession',
			'c.label as centre_label',
			'c.cofactor_kind',
			'pe.accession as protein_accession',
			'pr.name as protein_name',
			'pr.organism',
			'se.accession as source_accession',
			's.doi as source_doi',
			's.year as source_year',
			's.authors as source_authors'
		]);
	if (sort === 'relevance' && ranked) {
		page = page.orderBy(sql.ref('hit.key'), direction);
	} else {
		for (const column of SORT_COLUMNS[sort as Exclude<PotentialSort, 'relevance'>]) {
			page = page.orderBy(sql.ref(column), nullsLast(direction));
		}
	}
	const rows = await page
		.orderBy('p.entry_id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();

	const total = Number(counted.n);
	const nextOffset = options.offset + rows.length;
	return {
		items: rows.map(toPotentialDto),
		total,
		nextCursor: nextOffset < total && rows.length > 0 ? encodeCursor(nextOffset) : null
	};
}
