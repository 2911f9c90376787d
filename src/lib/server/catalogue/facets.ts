import type { Kysely } from 'kysely';
import type { CatalogueFacets } from '$lib/catalogue/dto';
import type { Database } from '../db/schema';
import { entryIsVisible, type Viewer } from './visibility';


/** Counts of visible potentials per cofactor kind, organism and method, and overall totals. */
export async function catalogueFacets(db: Kysely<Database>, viewer: Viewer | null): Promise<CatalogueFacets> {
	const visiblePotentials = db
		.selectFrom('potential as p')
		.innerJoin('entry as e', 'e.id', 'p.entry_id')
		.innerJoin('centre as c', 'c.entry_id', 'p.centre_entry_id')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.where((eb) =>
			eb.and([entryIsVisible(eb, 'e', viewer), entryIsVisible(eb, 'ce', viewer), entryIsVisible(eb, 'pe', viewer)])
		);
	const count = (column: 'c.cofactor_kind' | 'pr.organism' | 'p.method') =>
		visiblePotentials
			.select([`${column} as value`, (eb) => eb.fn.countAll<number>().as('count')])
			.groupBy(column)
			.orderBy('count', 'desc')
			.execute();
	const [kinds, organisms, methods] = await Promise.all([
		count('c.cofactor_kind'),
		count('pr.organism'),
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
