import type { Kysely } from 'kysely';
import type { Page, PotentialDto } from '$lib/catalogue/dto';
import type { PotentialFilter, PotentialSort } from '$lib/schemas/catalogueQuery';
import { encodeCursor } from '$lib/schemas/pagination';
import type { Database } from '../db/schema';
import { withVisibleSource } from './lists';
import { toPotentialDto } from './mappers';
import { accessionNumber } from '$lib/schemas/accession';
import { potentialIndex } from '../search/potentialIndex';
import { resolveTextQuery } from './textMatch';
import { potentialIsVisible, potentialRowVisibility, type Viewer } from './visibility';

export interface ListOptions<S extends string> {
	sort?: S;
	order?: 'asc' | 'desc';
	limit: number;
	offset: number;
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
	const { q, ...filters } = filter;
	const text = await resolveTextQuery(db, q);
	if (text.kind === 'centres' && text.ids.length === 0) {
		return { items: [], total: 0, nextCursor: null };
	}
	await potentialIndex.ensureCurrent(db);
	const relevance = text.kind === 'centres';
	const sort =
		options.sort === undefined || options.sort === 'relevance'
			? relevance
				? 'relevance'
				: 'protein'
			: options.sort;
	const { total, page } = potentialIndex.query(
		{
			filter: filters,
			accession:
				text.kind === 'accession' ? (accessionNumber(text.accession) ?? undefined) : undefined,
			rankedCentres: text.kind === 'centres' ? text.ids : undefined,
			sort,
			order: options.order ?? 'asc',
			offset: options.offset,
			limit: options.limit
		},
		potentialRowVisibility(viewer)
	);
	const rows =
		page.length === 0
			? []
			: await db
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
					.where('p.entry_id', 'in', page)
					// The index already applied visibility; the rule is applied again where rows leave the database.
					.where((eb) => potentialIsVisible(eb, 'p', viewer))
					.execute();
	const byId = new Map(rows.map((r) => [r.entry_id, r]));
	const items = page.flatMap((id) => {
		const row = byId.get(id);
		return row ? [toPotentialDto(row)] : [];
	});
	const next = options.offset + page.length;
	return { items, total, nextCursor: next < total && page.length > 0 ? encodeCursor(next) : null };
}
