import { sql, type Expression, type Kysely, type SqlBool } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { catalogueFacets } from '$lib/server/catalogue/facets';
import { listPotentials } from '$lib/server/catalogue/potentials';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

/*
 * The trade's spellings against the demo scenario. Each query lists its expected hits as a plain
 * SQL condition on the potential read model (and its source), written independently of the
 * search code: that condition is the oracle. Each expected set is non-empty unless said.
 */

let db: Kysely<Database>;
let remove: () => Promise<void>;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
});
afterAll(async () => remove());

type Where = Expression<SqlBool>;
const kindIn = (...kinds: string[]): Where => sql<SqlBool>`p.cofactor_kind in (${sql.join(kinds)})`;
const coupleIn = (...couples: string[]): Where => sql<SqlBool>`p.couple in (${sql.join(couples)})`;
const methodIs = (method: string): Where => sql<SqlBool>`p.method = ${method}`;
const sourceWhere = (condition: Where): Where =>
	sql<SqlBool>`p.source_entry_id in (select entry_id from source s where ${condition})`;
const and = (a: Where, b: Where): Where => sql<SqlBool>`(${a}) and (${b})`;

async function expected(where: Where): Promise<string[]> {
	const rows = await db
		.selectFrom('potential as p')
		.select('p.accession')
		.where(where)
		.orderBy('p.accession')
		.execute();
	return rows.map((r) => r.accession);
}

async function found(q: string, sort?: 'em'): Promise<string[]> {
	const page = await listPotentials(db, { q }, { limit: 500, sort }, null);
	return page.items.map((p) => p.accession).sort();
}

const FE4S4 = kindIn('fe4s4', 'fe4s4_hipip');
const CASES: [string[], () => Where, string][] = [
	[['4Fe4S', 'Fe4S4', '[4Fe-4S]', '4Fe-4S', '[Fe4S4]', '4fe-4s'], () => FE4S4, '[4Fe-4S] centres'],
	[
		['[4Fe-4S]2+/1+', '[4Fe4S]2+/+', '4Fe-4S2+/1+', '[4Fe–4S]²⁺/¹⁺', 'Fe4S4 2+/1+', '4Fe4S +2/+1'],
		() => coupleIn('[4Fe-4S]2+/1+'),
		'the [4Fe-4S]2+/1+ couple'
	],
	[['2+/1+', '2+/+'], () => coupleIn('[4Fe-4S]2+/1+', '[2Fe-2S]2+/1+', 'Cu2+/Cu+'), 'any 2+/1+'],
	[['[3Fe-4S]1+/0', '3Fe4S 1+/0'], () => coupleIn('[3Fe-4S]1+/0'), 'the [3Fe-4S]1+/0 couple'],
	[['2Fe2S', '[2Fe-2S]', 'Fe2S2'], () => kindIn('fe2s2_ferredoxin', 'fe2s2_rieske'), '[2Fe-2S]'],
	[['Rieske', 'rieske-type'], () => kindIn('fe2s2_rieske'), 'Rieske clusters'],
	[['heme c', 'haem c', 'heme-c', 'c-type heme'], () => kindIn('heme_c'), 'heme c, not heme b'],
	[['heme b', 'haem b'], () => kindIn('heme_b'), 'heme b only'],
	[['heme', 'haem'], () => kindIn('heme_a', 'heme_b', 'heme_c'), 'every heme'],
	[['menaquinone', 'MK'], () => kindIn('menaquinone'), 'menaquinone'],
	[['type-1 Cu', 'type 1 copper', 'T1 Cu'], () => kindIn('cu_type1'), 'type-1 copper'],
	[['EPR'], () => methodIs('epr_titration'), 'EPR-monitored titrations'],
	[['PFV', 'protein film voltammetry'], () => methodIs('protein_film_voltammetry'), 'PFV'],
	[['SEC', 'spectroelectrochemistry'], () => methodIs('spectroelectrochemistry'), 'SEC'],
	[['MCD'], () => methodIs('mcd_titration'), 'MCD'],
	[['Moreau', 'moreau'], () => sourceWhere(sql<SqlBool>`s.authors like '%Moreau%'`), 'an author'],
	[['Céline', 'Celine'], () => sourceWhere(sql<SqlBool>`s.authors like '%Céline%'`), 'accents'],
	[['2021'], () => sourceWhere(sql<SqlBool>`s.year = 2021`), 'a year'],
	[
		[
			'10.5555/hopline.demo.2020.033',
			'doi:10.5555/hopline.demo.2020.033',
			'https://doi.org/10.5555/HOPLINE.DEMO.2020.033'
		],
		() => sourceWhere(sql<SqlBool>`s.doi = '10.5555/hopline.demo.2020.033'`),
		'a DOI'
	],
	[['EPR 4Fe4S', '4Fe4S EPR'], () => and(FE4S4, methodIs('epr_titration')), 'two kinds of term'],
	[
		['Lindqvist 4Fe4S 2+/1+'],
		() => and(coupleIn('[4Fe-4S]2+/1+'), sourceWhere(sql<SqlBool>`s.authors like '%Lindqvist%'`)),
		'author and couple'
	]
];

describe('search vocabulary on the demo scenario', () => {
	for (const [queries, where, what] of CASES) {
		for (const q of queries) {
			it(`"${q}" finds ${what}`, async () => {
				const want = await expected(where());
				expect(want.length).toBeGreaterThan(0);
				expect(await found(q)).toEqual(want);
			});
		}
	}

	it('"heme c" returns no heme b (a phrase, not two words)', async () => {
		const hemeB = await expected(kindIn('heme_b'));
		expect(hemeB.length).toBeGreaterThan(0);
		for (const accession of await found('heme c')) expect(hemeB).not.toContain(accession);
	});

	it('words keep restricting the rows when sorting by another column (it returned every row)', async () => {
		expect(await found('rieske', 'em')).toEqual(await expected(kindIn('fe2s2_rieske')));
	});

	it('the protein and centre lists read cluster spellings the same way', async () => {
		const { listCentres } = await import('$lib/server/kinds/centre');
		const centres = await listCentres(db, { q: 'Fe4S4' }, { limit: 100 }, null);
		const fe4s4 = await db
			.selectFrom('centre')
			.select('entry_id')
			.where('cofactor_kind', 'in', ['fe4s4', 'fe4s4_hipip'])
			.execute();
		expect(centres.total).toBe(fe4s4.length);
	});
});

describe('facet counts within the search', () => {
	it('count each facet with every filter but its own', async () => {
		const facets = await catalogueFacets(db, null, { q: '4Fe4S', method: ['epr_titration'] });
		// All potentials of [4Fe-4S] centres measured by EPR: the total and the kind facet.
		const both = await expected(and(FE4S4, methodIs('epr_titration')));
		expect(facets.totals.potentials).toBe(both.length);
		expect(facets.kinds).toEqual([{ value: 'fe4s4', count: both.length }]);
		// The method facet ignores the method filter: every method of [4Fe-4S] potentials.
		const perMethod = await db
			.selectFrom('potential as p')
			.select(['p.method as value', (eb) => eb.fn.countAll<number>().as('count')])
			.where(FE4S4)
			.groupBy('p.method')
			.execute();
		expect(Object.fromEntries(facets.methods.map((m) => [m.value, m.count]))).toEqual(
			Object.fromEntries(perMethod.map((m) => [m.value, Number(m.count)]))
		);
	});

	it('without filters, count the whole catalogue the reader may see', async () => {
		const facets = await catalogueFacets(db, null);
		const all = await expected(sql<SqlBool>`1 = 1`);
		expect(facets.totals.potentials).toBe(all.length);
	});
});
