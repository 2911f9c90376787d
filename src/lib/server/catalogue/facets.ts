import type { Kysely } from 'kysely';
import type { CatalogueFacets } from '$lib/catalogue/dto';
import type { PotentialFilter } from '$lib/schemas/catalogueQuery';
import type { Database } from '../db/schema';
import { potentialIndex } from '../search/potentialIndex';
import { potentialSearch } from './potentials';
import { entryIsVisible, potentialRowVisibility, type Viewer } from './visibility';

/**
 * Counts of the potentials a search matches per cofactor kind, organism and method — each
 * facet with every filter but its own applied, so a count is what ticking that choice would
 * give (see `PotentialIndex.facets`) — and overall totals. Without a filter, the whole
 * catalogue the reader may see. Proteins and centres are counted over the whole catalogue.
 */
export async function catalogueFacets(
	db: Kysely<Database>,
	viewer: Viewer | null,
	filter: PotentialFilter = {}
): Promise<CatalogueFacets> {
	const search = await potentialSearch(db, filter, undefined, 'asc', viewer);
	await potentialIndex.ensureCurrent(db);
	const potentials = potentialIndex.facets(search.query, potentialRowVisibility(viewer));
	const proteins = await db
		.selectFrom('protein as pr')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) => entryIsVisible(eb, 'pe', viewer))
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	const centres = await db
		.selectFrom('centre as c')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.where((eb) => entryIsVisible(eb, 'ce', viewer))
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.executeTakeFirstOrThrow();
	return {
		kinds: potentials.kinds,
		organisms: potentials.organisms,
		methods: potentials.methods,
		totals: {
			proteins: Number(proteins.n),
			centres: Number(centres.n),
			potentials: potentials.total
		}
	};
}
