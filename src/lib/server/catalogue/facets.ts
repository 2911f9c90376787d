import type { Kysely } from 'kysely';
import type { CatalogueFacets } from '$lib/catalogue/dto';
import type { Database } from '../db/schema';
import { potentialIndex } from '../search/potentialIndex';
import { entryIsVisible, potentialRowVisibility, type Viewer } from './visibility';

/** Counts of visible potentials per cofactor kind, organism and method, and overall totals. */
export async function catalogueFacets(
	db: Kysely<Database>,
	viewer: Viewer | null
): Promise<CatalogueFacets> {
	await potentialIndex.ensureCurrent(db);
	const potentials = potentialIndex.facets(potentialRowVisibility(viewer));
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
