import type { Kysely } from 'kysely';
import type { CatalogueFacets } from '$lib/catalogue/dto';
import type { Database } from '../db/schema';
import { entryIsVisible, potentialIsVisible, type Viewer } from './visibility';

/** Counts of visible potentials per cofactor kind, organism and method, and overall totals. */
export async function catalogueFacets(
	db: Kysely<Database>,
	viewer: Viewer | null
): Promise<CatalogueFacets> {
	const visiblePotentials = db
		.selectFrom('potential as p')
		.where((eb) => potentialIsVisible(eb, 'p', viewer));
	const count = (column: 'p.cofactor_kind' | 'p.organism' | 'p.method') =>
		visiblePotentials
			.select([`${column} as value`, (eb) => eb.fn.countAll<number>().as('count')])
			.groupBy(column)
			.orderBy('count', 'desc')
			.execute();
	const [kinds, organisms, methods] = await Promise.all([
		count('p.cofactor_kind'),
		count('p.organism'),
		count('p.method')
	]);
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
	const toCounts = (rows: { value: string; count: number }[]) =>
		rows.map((r) => ({ value: r.value, count: Number(r.count) }));
	return {
		kinds: toCounts(kinds),
		organisms: toCounts(organisms),
		methods: toCounts(methods),
		totals: {
			proteins: Number(proteins.n),
			centres: Number(centres.n),
			potentials: toCounts(kinds).reduce((sum, k) => sum + k.count, 0)
		}
	};
}
