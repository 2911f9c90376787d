import fc from 'fast-check';
import { sql, type Kysely, type RawBuilder } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '$lib/server/db/schema';
import { listPotentials } from '$lib/server/catalogue/potentials';
import {
	entryRowIsVisible,
	potentialIsVisible,
	potentialRowVisibility,
	type Viewer
} from '$lib/server/catalogue/visibility';
import {
	COFACTOR_KINDS,
	COUPLES_BY_KIND,
	POTENTIAL_METHODS,
	type CofactorKind,
	type PotentialMethod,
	type Visibility
} from '$lib/schemas/vocabulary';
import { POTENTIAL_SORTS, type PotentialSort } from '$lib/catalogue/searchTable';
import type { PotentialFilter } from '$lib/schemas/catalogueQuery';
import { loadDemoScenario } from '$seed/load';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
import { PotentialIndex, loadColumns, type IndexResult } from '$lib/server/search/potentialIndex';
import { createTempDatabase } from '../support/tempDb';

// The in-memory columns must answer exactly as SQL over the same read-model table would.
// The oracle here is SQLite itself: the same filters written as a plain SQL WHERE clause.

let db: Kysely<Database>;
let remove: () => Promise<void>;
beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	// Two potentials without pH or temperature, so that missing values are part of every check.
	const centre = await db
		.selectFrom('potential')
		.select(['centre_accession', 'couple'])
		.executeTakeFirstOrThrow();
	await db.transaction().execute(async (trx) => {
		for (const value of [-250, -150]) {
			const entry = await createEntry(trx, { kind: 'potential' });
			const data = normalisePotential(
				potentialInputSchema.parse({
					centreAccession: centre.centre_accession,
					couple: centre.couple,
					reportedValue: value,
					reportedUnit: 'mV',
					referenceElectrode: 'SCE',
					method: 'computed'
				})
			);
			await approveVersion(trx, await addVersion(trx, entry.id, data, { status: 'submitted' }));
		}
	});
});
afterAll(async () => remove());

async function sqlOracle(
	f: PotentialFilter,
	sort: PotentialSort,
	order: 'asc' | 'desc'
): Promise<string[]> {
	const where = [sql`public_from <= ${new Date().toISOString()}`];
	if (f.kind?.length) where.push(sql`cofactor_kind in (${sql.join(f.kind)})`);
	if (f.method?.length) where.push(sql`method in (${sql.join(f.method)})`);
	if (f.emMin !== undefined) where.push(sql`em_mv_she >= ${f.emMin}`);
	if (f.emMax !== undefined) where.push(sql`em_mv_she <= ${f.emMax}`);
	if (f.phMin !== undefined) where.push(sql`ph >= ${f.phMin}`);
	if (f.phMax !== undefined) where.push(sql`ph <= ${f.phMax}`);
	if (f.tMin !== undefined) where.push(sql`temperature_k >= ${f.tMin}`);
	if (f.tMax !== undefined) where.push(sql`temperature_k <= ${f.tMax}`);
	const column = { em: 'em_mv_she', ph: 'ph', temperature: 'temperature_k', accession: 'entry_id' }[
		sort as 'em'
	];
	const direction = order === 'asc' ? sql`asc` : sql`desc`;
	const idOrder = order === 'asc' ? sql`asc` : sql`desc`;
	const { rows } = await sql<{
		accession: string;
	}>`select accession from potential where ${sql.join(where, sql` and `)}
		order by ${sql.ref(column)} is null, ${sql.ref(column)} ${direction}, entry_id ${idOrder}`.execute(
		db
	);
	return rows.map((r) => r.accession);
}

const optional = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
const filterArb: fc.Arbitrary<PotentialFilter> = fc.record({
	kind: optional(fc.subarray([...COFACTOR_KINDS], { minLength: 1, maxLength: 3 })),
	method: optional(fc.subarray([...POTENTIAL_METHODS], { minLength: 1, maxLength: 2 })),
	emMin: optional(fc.integer({ min: -500, max: 400 })),
	emMax: optional(fc.integer({ min: -500, max: 400 })),
	phMin: optional(fc.constantFrom(5.5, 6, 7, 8)),
	phMax: optional(fc.constantFrom(6.5, 7, 8, 10)),
	tMin: optional(fc.constantFrom(280, 298.15, 320)),
	tMax: optional(fc.constantFrom(298.15, 330, 340))
});

describe('in-memory potential columns', () => {
	it('filter, count and order exactly as SQL does', async () => {
		await fc.assert(
			fc.asyncProperty(
				filterArb,
				fc.constantFrom<PotentialSort>('em', 'ph', 'temperature', 'accession'),
				fc.constantFrom<'asc' | 'desc'>('asc', 'desc'),
				async (filter, sort, order) => {
					const expected = await sqlOracle(filter, sort, order);
					const got = await listPotentials(
						db,
						filter,
						{ sort, order, limit: 1000, offset: 0 },
						null
					);
					expect(got.total).toBe(expected.length);
					expect(got.items.map((p) => p.accession)).toEqual(expected);
				}
			),
			{ numRuns: 150 }
		);
	});
	it('pages cover the whole result without gaps or repeats', async () => {
		const all = await listPotentials(
			db,
			{},
			{ sort: 'ph', order: 'desc', limit: 1000, offset: 0 },
			null
		);
		const paged: string[] = [];
		for (let offset = 0; offset < all.total; offset += 7) {
			const page = await listPotentials(
				db,
				{},
				{ sort: 'ph', order: 'desc', limit: 7, offset },
				null
			);
			paged.push(...page.items.map((p) => p.accession));
		}
		expect(paged).toEqual(all.items.map((p) => p.accession));
		const ph = all.items.map((p) => p.ph);
		const known = ph.filter((v): v is number => v !== null);
		expect(known).toEqual([...known].sort((a, b) => b - a));
		expect(known.length).toBeLessThan(ph.length);
		expect(ph.slice(known.length).every((v) => v === null)).toBe(true);
	});
});

// Random catalogues built through the approval path (so public_from and group_id are computed as
// in production), random readers (signed out, or members of some groups) and every sort key: the
// in-memory index with `potentialRowVisibility` must answer exactly as SQL with
// `potentialIsVisible` — the two halves of the visibility rule in catalogue/visibility.ts —
// and plain SQL filters and ORDER BY clauses written out here.

type VisibilitySpec =
	| { visibility: 'public' }
	| { visibility: 'group'; group: number }
	| { visibility: 'embargoed'; ended: boolean; group: number | null };

interface CatalogueSpec {
	groups: number;
	proteins: { name: string; organism: string; vis: VisibilitySpec }[];
	centres: { protein: number; label: string; kind: CofactorKind; vis: VisibilitySpec }[];
	potentials: {
		centre: number;
		/** Index into the couples the centre's kind allows (any of COUPLES for 'other'). */
		couple: number;
		mv: number;
		ph: number | null;
		t: number | null;
		method: PotentialMethod;
		vis: VisibilitySpec;
	}[];
}

// Text with the characters a concatenating reader would trip on: separators, quotes, commas.
const ORGANISMS = [
	'Thermus aquaticus',
	'Pyro\u001fcoccus',
	'Aqui,fex; "ae"',
	'Ünïcode ß',
	'Zz\u001ezz'
];
// Two names JavaScript's `<` orders the other way round from SQLite (UTF-16 units against code
// points: U+FF46 against U+1D523), so that keyset positions in the text orders are tested too.
const NAMES = [
	'ferredoxin',
	'Ferredoxin',
	'cytochrome c',
	'hydrogenase "large"',
	'aa\u001fbb',
	'\uff46erredoxin',
	'\u{1d523}erredoxin'
];
const LABELS = ['FS0', 'FS1', 'heme A', 'Cu_A', 'fs1'];
const COUPLES = ['ox/red', 'A,b;"c"\u001f'];
/** Kinds with several couples, one with one, and 'other', which takes any. */
const KINDS: CofactorKind[] = ['fe4s4', 'fmn', 'ubiquinone', 'heme_c', 'other'];
const GROUPS = 3;

const visibilityArb: fc.Arbitrary<VisibilitySpec> = fc.oneof(
	{ weight: 6, arbitrary: fc.constant({ visibility: 'public' as const }) },
	fc.record({
		visibility: fc.constant('group' as const),
		group: fc.integer({ min: 0, max: GROUPS - 1 })
	}),
	fc.record({
		visibility: fc.constant('embargoed' as const),
		ended: fc.boolean(),
		group: fc.option(fc.integer({ min: 0, max: GROUPS - 1 }), { nil: null })
	})
);

const catalogueArb: fc.Arbitrary<CatalogueSpec> = fc
	.record({
		proteins: fc.array(
			fc.record({
				name: fc.constantFrom(...NAMES),
				organism: fc.constantFrom(...ORGANISMS),
				vis: visibilityArb
			}),
			{ minLength: 1, maxLength: 4 }
		),
		centres: fc.array(
			fc.record({
				protein: fc.nat(),
				label: fc.constantFrom(...LABELS),
				kind: fc.constantFrom(...KINDS),
				vis: visibilityArb
			}),
			{ minLength: 1, maxLength: 6 }
		),
		potentials: fc.array(
			fc.record({
				centre: fc.nat(),
				couple: fc.nat(),
				// Few distinct values, so that ties (broken by accession) are common.
				mv: fc.integer({ min: -4, max: 4 }).map((v) => v * 50),
				ph: fc.option(fc.constantFrom(6, 7, 7.5, 8), { nil: null }),
				t: fc.option(fc.constantFrom(277, 298.15, 310), { nil: null }),
				method: fc.constantFrom(...POTENTIAL_METHODS.slice(0, 3)),
				vis: visibilityArb
			}),
			{ minLength: 3, maxLength: 30, size: 'large' }
		)
	})
	.map((c) => ({ groups: GROUPS, ...c }));

interface Built {
	db: Kysely<Database>;
	remove: () => Promise<void>;
	groupIds: number[];
	proteins: { id: number; accession: string }[];
	centres: { id: number; accession: string }[];
	potentials: { id: number; accession: string }[];
}

async function buildCatalogue(spec: CatalogueSpec): Promise<Built> {
	const { db, remove } = await createTempDatabase();
	const groupIds: number[] = [];
	for (let g = 0; g < spec.groups; g++) {
		const { id } = await db
			.insertInto('research_group')
			.values({ slug: `group-${g}`, name: `Group ${g}` })
			.returning('id')
			.executeTakeFirstOrThrow();
		groupIds.push(id);
	}
	const visibility = (v: VisibilitySpec) => ({
		visibility: v.visibility as Visibility,
		groupId: v.visibility === 'public' || v.group === null ? null : groupIds[v.group]!,
		embargoUntil:
			v.visibility === 'embargoed'
				? v.ended
					? '2020-03-01T00:00:00.000Z'
					: '2099-03-01T00:00:00.000Z'
				: null
	});
	return db.transaction().execute(async (trx) => {
		const add = async (
			kind: 'protein' | 'centre' | 'potential',
			data: unknown,
			vis: VisibilitySpec
		) => {
			const entry = await createEntry(trx, { kind, ...visibility(vis) });
			await approveVersion(trx, await addVersion(trx, entry.id, data, { status: 'submitted' }));
			return entry;
		};
		const proteins = [];
		for (const p of spec.proteins)
			proteins.push(await add('protein', { name: p.name, organism: p.organism }, p.vis));
		const centres = [];
		for (const c of spec.centres) {
			const protein = proteins[c.protein % proteins.length]!;
			centres.push(
				await add(
					'centre',
					{ proteinAccession: protein.accession, label: c.label, cofactorKind: c.kind },
					c.vis
				)
			);
		}
		const potentials = [];
		for (const p of spec.potentials) {
			const centre = centres[p.centre % centres.length]!;
			const allowed = COUPLES_BY_KIND[spec.centres[p.centre % centres.length]!.kind];
			const couples = allowed.length > 0 ? allowed : COUPLES;
			const data = normalisePotential(
				potentialInputSchema.parse({
					centreAccession: centre.accession,
					couple: couples[p.couple % couples.length],
					reportedValue: p.mv,
					reportedUnit: 'mV',
					referenceElectrode: 'SHE',
					ph: p.ph,
					temperatureK: p.t,
					method: p.method
				})
			);
			potentials.push(await add('potential', data, p.vis));
		}
		return { db, remove, groupIds, proteins, centres, potentials };
	});
}

interface QuerySpec {
	/** Indices into the catalogue's groups (3 = a group that holds nothing); null = signed out. */
	viewer: number[] | null;
	kind?: CofactorKind[];
	method?: PotentialMethod[];
	organism?: string[];
	protein?: number;
	centre?: number;
	accession?: number;
	emMin?: number;
	emMax?: number;
	phMin?: number;
	phMax?: number;
	tMin?: number;
	tMax?: number;
	sort: PotentialSort;
	order: 'asc' | 'desc';
	/** For relevance: a ranking of centres (indices), as the text index would give. */
	ranked?: number[];
	offset: number;
	limit: number;
}

/** A filter present in about one query of five, so that most queries still find rows. */
const sometimes = <T>(arb: fc.Arbitrary<T>) =>
	fc.oneof({ weight: 4, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: arb });

const queryArb: fc.Arbitrary<QuerySpec> = fc.record({
	viewer: fc.option(fc.uniqueArray(fc.integer({ min: 0, max: GROUPS }), { maxLength: 3 }), {
		nil: null
	}),
	kind: sometimes(fc.subarray([...KINDS], { minLength: 1, maxLength: 3 })),
	method: sometimes(
		fc.subarray([...POTENTIAL_METHODS.slice(0, 4)], { minLength: 1, maxLength: 2 })
	),
	organism: sometimes(
		fc.subarray([...ORGANISMS, 'Unknown organism'], { minLength: 1, maxLength: 3 })
	),
	protein: sometimes(fc.nat()),
	centre: sometimes(fc.nat()),
	accession: sometimes(fc.nat()),
	emMin: sometimes(fc.integer({ min: -250, max: 150 })),
	emMax: sometimes(fc.integer({ min: -150, max: 250 })),
	phMin: sometimes(fc.constantFrom(6, 7, 7.5)),
	phMax: sometimes(fc.constantFrom(7, 7.5, 8)),
	tMin: sometimes(fc.constantFrom(277, 298.15)),
	tMax: sometimes(fc.constantFrom(298.15, 310)),
	sort: fc.constantFrom(...POTENTIAL_SORTS),
	order: fc.constantFrom<'asc' | 'desc'>('asc', 'desc'),
	ranked: fc.option(fc.uniqueArray(fc.nat({ max: 5 }), { maxLength: 6 }), {
		nil: undefined,
		freq: 4
	}),
	offset: fc.nat({ max: 10 }),
	limit: fc.integer({ min: 1, max: 30 })
});

/** The query in the index's terms and the same query answered by SQLite. */
function resolveQuery(built: Built, q: QuerySpec) {
	const pick = <T>(list: T[], i: number | undefined) =>
		i === undefined || list.length === 0 ? undefined : list[i % list.length];
	const viewer: Viewer | null =
		q.viewer === null ? null : { groupIds: q.viewer.map((g) => built.groupIds[g] ?? 9999) };
	const everything = [...built.potentials, ...built.centres, ...built.proteins];
	const filter: PotentialFilter = {
		kind: q.kind,
		method: q.method,
		organism: q.organism,
		protein: pick(built.proteins, q.protein)?.accession,
		centre: pick(built.centres, q.centre)?.accession,
		emMin: q.emMin,
		emMax: q.emMax,
		phMin: q.phMin,
		phMax: q.phMax,
		tMin: q.tMin,
		tMax: q.tMax
	};
	const accession = pick(everything, q.accession)?.id;
	// Scores fall with the ranking, with ties (which the index breaks by centre id).
	// Text reaches centres (one term); it restricts the rows in every sort and ranks them in
	// relevance.
	const rankedCentres = q.ranked
		? [...new Set(q.ranked.map((i) => pick(built.centres, i)!.id))].map((id, i, all) => ({
				id,
				score: Math.ceil((all.length - i) / 2)
			}))
		: undefined;
	return { viewer, filter, accession, rankedCentres };
}

/** The text of a resolved query as the index takes it: one term reaching the ranked centres. */
const textOf = (r: ReturnType<typeof resolveQuery>) =>
	r.rankedCentres ? [{ centres: new Map(r.rankedCentres.map((c) => [c.id, c.score])) }] : undefined;

/** The potentials a query matches in SQL, every filter but `except` applied. */
function sqlMatching(
	db: Kysely<Database>,
	r: ReturnType<typeof resolveQuery>,
	except?: 'kind' | 'method' | 'organism'
) {
	const { filter: f, viewer } = r;
	let query = db.selectFrom('potential as p').where((eb) => potentialIsVisible(eb, 'p', viewer));
	if (f.kind && except !== 'kind') query = query.where('p.cofactor_kind', 'in', f.kind);
	if (f.method && except !== 'method') query = query.where('p.method', 'in', f.method);
	if (f.organism && except !== 'organism') query = query.where('p.organism', 'in', f.organism);
	if (f.protein) query = query.where('p.protein_accession', '=', f.protein);
	if (f.centre) query = query.where('p.centre_accession', '=', f.centre);
	if (f.emMin !== undefined) query = query.where('p.em_mv_she', '>=', f.emMin);
	if (f.emMax !== undefined) query = query.where('p.em_mv_she', '<=', f.emMax);
	if (f.phMin !== undefined) query = query.where('p.ph', '>=', f.phMin);
	if (f.phMax !== undefined) query = query.where('p.ph', '<=', f.phMax);
	if (f.tMin !== undefined) query = query.where('p.temperature_k', '>=', f.tMin);
	if (f.tMax !== undefined) query = query.where('p.temperature_k', '<=', f.tMax);
	if (r.accession !== undefined) {
		const a = r.accession;
		query = query.where((eb) =>
			eb.or([
				eb('p.entry_id', '=', a),
				eb('p.centre_entry_id', '=', a),
				eb('p.protein_entry_id', '=', a)
			])
		);
	}
	if (r.rankedCentres)
		query = query.where('p.centre_entry_id', 'in', [-1, ...r.rankedCentres.map((c) => c.id)]);
	return query;
}

async function sqlAnswer(
	db: Kysely<Database>,
	q: QuerySpec,
	r: ReturnType<typeof resolveQuery>
): Promise<number[]> {
	const query = sqlMatching(db, r).select('p.entry_id');
	const dir = q.order === 'asc' ? sql`asc` : sql`desc`;
	const by = (...columns: string[]) =>
		sql.join(
			columns.map((c) => sql`${sql.ref(c)} ${dir}`),
			sql`, `
		);
	let order: RawBuilder<unknown>;
	if (r.rankedCentres && q.sort === 'relevance') {
		const ranked = r.rankedCentres;
		if (ranked.length === 0) return [];
		const score = sql`case ${sql.join(
			ranked.map((c) => sql`when p.centre_entry_id = ${c.id} then ${c.score}`),
			sql` `
		)} end`;
		// Best score first, ties by centre, a centre's rows by accession; desc reverses it all.
		const back = q.order === 'asc' ? sql`desc` : sql`asc`;
		order = sql`${score} ${back}, p.centre_entry_id ${dir}, p.entry_id ${dir}`;
	} else {
		const sort = q.sort === 'relevance' ? 'protein' : q.sort;
		const numeric = {
			accession: 'entry_id',
			em: 'em_mv_she',
			ph: 'ph',
			temperature: 'temperature_k'
		}[sort as 'em'];
		if (numeric) {
			order = sql`${sql.ref(`p.${numeric}`)} is null, ${by(`p.${numeric}`, 'p.entry_id')}`;
		} else {
			const text: Record<string, string[]> = {
				protein: ['protein_name', 'centre_label', 'couple', 'entry_id'],
				centre: ['centre_label', 'protein_name', 'entry_id'],
				kind: ['cofactor_kind', 'protein_name', 'centre_label', 'entry_id'],
				couple: ['couple', 'entry_id'],
				method: ['method', 'entry_id']
			};
			order = by(...text[sort]!.map((c) => `p.${c}`));
		}
	}
	const rows = await query.orderBy(order).execute();
	return rows.map((row) => row.entry_id);
}

/**
 * Facet counts as SQLite gives them for the reader and the query: value → count, per column,
 * each with every filter but its own.
 */
async function sqlFacets(db: Kysely<Database>, r: ReturnType<typeof resolveQuery>) {
	const facetOf = { cofactor_kind: 'kind', organism: 'organism', method: 'method' } as const;
	const counts = async (column: 'cofactor_kind' | 'organism' | 'method') => {
		const rows = await sqlMatching(db, r, facetOf[column])
			.select([`p.${column} as value`, (eb) => eb.fn.countAll<number>().as('count')])
			.groupBy(`p.${column}`)
			.execute();
		return Object.fromEntries(rows.map((r) => [r.value, Number(r.count)]));
	};
	return {
		kinds: await counts('cofactor_kind'),
		organisms: await counts('organism'),
		methods: await counts('method')
	};
}

describe('in-memory potential columns on random catalogues and readers', () => {
	it('see, filter, count, facet and order exactly as SQL does, for every sort key', async () => {
		await fc.assert(
			fc.asyncProperty(
				catalogueArb,
				fc.array(queryArb, { minLength: 1, maxLength: 12 }),
				async (spec, queries) => {
					const built = await buildCatalogue(spec);
					try {
						const index = new PotentialIndex();
						await index.ensureCurrent(built.db);
						const entries = new Map(
							(
								await built.db
									.selectFrom('entry')
									.select(['id', 'visibility', 'embargo_until', 'group_id'])
									.execute()
							).map((e) => [e.id, e])
						);
						const chains = new Map(
							(
								await built.db
									.selectFrom('potential')
									.select(['entry_id', 'centre_entry_id', 'protein_entry_id'])
									.execute()
							).map((p) => [p.entry_id, [p.entry_id, p.centre_entry_id, p.protein_entry_id]])
						);
						for (const q of queries) {
							const r = resolveQuery(built, q);
							const expected = await sqlAnswer(built.db, q, r);
							// The row rule never shows more than the entries' own rule allows: a row
							// is seen only when its potential, centre and protein all are.
							for (const id of expected)
								for (const entryId of chains.get(id)!)
									expect(entryRowIsVisible(entries.get(entryId)!, r.viewer)).toBe(true);
							const visible = potentialRowVisibility(r.viewer);
							const all = index.query(
								{
									filter: r.filter,
									accession: r.accession,
									text: textOf(r),
									sort: q.sort,
									order: q.order,
									offset: 0,
									limit: 1000
								},
								visible
							);
							expect(all.page).toEqual(expected);
							expect(all.total).toBe(expected.length);
							const page = index.query(
								{
									filter: r.filter,
									accession: r.accession,
									text: textOf(r),
									sort: q.sort,
									order: q.order,
									offset: q.offset,
									limit: q.limit
								},
								visible
							);
							expect(page.page).toEqual(expected.slice(q.offset, q.offset + q.limit));
							expect(page.total).toBe(expected.length);

							// Keyset: pages after the last row's key, then back before the first's,
							// give the same rows in the same order, with their offsets.
							const base = {
								filter: r.filter,
								accession: r.accession,
								text: textOf(r),
								sort: q.sort,
								order: q.order,
								limit: q.limit
							};
							const forward: IndexResult[] = [index.query(base, visible)];
							// As the API does: a next page while rows remain after this one.
							const more = (p: IndexResult) => p.last && p.offset + p.page.length < p.total;
							while (more(forward.at(-1)!) && forward.length <= expected.length)
								forward.push(index.query({ ...base, after: forward.at(-1)!.last! }, visible));
							expect(forward.flatMap((p) => p.page)).toEqual(expected);
							forward.forEach((p, i) => expect(p.offset).toBe(i * q.limit));
							for (let i = forward.length - 2; i > 0; i--) {
								const back = index.query({ ...base, before: forward[i]!.first! }, visible);
								expect(back.page).toEqual(forward[i - 1]!.page);
								expect(back.offset).toBe(forward[i - 1]!.offset);
							}

							const facets = index.facets(
								{ filter: r.filter, accession: r.accession, text: textOf(r) },
								visible
							);
							const oracle = await sqlFacets(built.db, r);
							const asObject = (list: { value: string; count: number }[]) =>
								Object.fromEntries(list.map((f) => [f.value, f.count]));
							expect(asObject(facets.kinds)).toEqual(oracle.kinds);
							expect(asObject(facets.organisms)).toEqual(oracle.organisms);
							expect(asObject(facets.methods)).toEqual(oracle.methods);
							expect(facets.total).toBe(expected.length);
						}
					} finally {
						await built.remove();
					}
				}
			),
			{ numRuns: 60 }
		);
	});

	it('readers see group rows of their own groups only, and embargoed rows once the date passed', async () => {
		// A fixed catalogue beside the random ones, so that each case is certainly drawn.
		const built = await buildCatalogue({
			groups: GROUPS,
			proteins: [
				{ name: 'ferredoxin', organism: 'Thermus aquaticus', vis: { visibility: 'public' } }
			],
			centres: [{ protein: 0, label: 'FS1', kind: 'other', vis: { visibility: 'public' } }],
			potentials: [
				{ visibility: 'public' as const },
				{ visibility: 'group' as const, group: 0 },
				{ visibility: 'group' as const, group: 1 },
				{ visibility: 'embargoed' as const, ended: false, group: 0 },
				{ visibility: 'embargoed' as const, ended: true, group: 1 },
				{ visibility: 'embargoed' as const, ended: false, group: null }
			].map((vis) => ({
				centre: 0,
				couple: 0,
				mv: -100,
				ph: 7,
				t: 298.15,
				method: 'epr_titration',
				vis
			}))
		});
		try {
			const index = new PotentialIndex();
			await index.ensureCurrent(built.db);
			const ids = built.potentials.map((p) => p.id);
			const seen = (viewer: Viewer | null) =>
				index.query(
					{ filter: {}, sort: 'accession', order: 'asc', offset: 0, limit: 100 },
					potentialRowVisibility(viewer)
				).page;
			expect(seen(null)).toEqual([ids[0], ids[4]]);
			expect(seen({ groupIds: [built.groupIds[0]!] })).toEqual([ids[0], ids[1], ids[3], ids[4]]);
			expect(seen({ groupIds: [built.groupIds[1]!] })).toEqual([ids[0], ids[2], ids[4]]);
			expect(seen({ groupIds: built.groupIds })).toEqual([ids[0], ids[1], ids[2], ids[3], ids[4]]);
		} finally {
			await built.remove();
		}
	});
});

describe('loading the columns', () => {
	it('walks text orders by keyset where UTF-16 and SQLite disagree', async () => {
		// Every name, each on its own protein: a walk of one row a page puts a cursor on each, so
		// every pair of neighbours in SQLite's order is compared (U+FF46 sorts before U+1D523 there).
		const built = await buildCatalogue({
			groups: GROUPS,
			proteins: NAMES.map((name) => ({
				name,
				organism: 'Thermus aquaticus',
				vis: { visibility: 'public' as const }
			})),
			centres: NAMES.map((_, i) => ({
				protein: i,
				label: 'FS1',
				kind: 'other' as const,
				vis: { visibility: 'public' as const }
			})),
			potentials: NAMES.map((_, i) => ({
				centre: i,
				couple: 0,
				mv: 0,
				ph: 7,
				t: 298.15,
				method: 'epr_titration' as const,
				vis: { visibility: 'public' as const }
			}))
		});
		try {
			const index = new PotentialIndex();
			await index.ensureCurrent(built.db);
			const visible = potentialRowVisibility(null);
			for (const order of ['asc', 'desc'] as const) {
				const expected = await sqlAnswer(
					built.db,
					{ viewer: null, sort: 'protein', order, offset: 0, limit: 1 },
					{ viewer: null, filter: {}, accession: undefined, rankedCentres: undefined }
				);
				const base = { filter: {}, sort: 'protein' as const, order, limit: 1 };
				const walked = [index.query(base, visible)];
				while (walked.length < NAMES.length)
					walked.push(index.query({ ...base, after: walked.at(-1)!.last! }, visible));
				expect(walked.flatMap((p) => p.page)).toEqual(expected);
			}
		} finally {
			await built.remove();
		}
	});

	it('keeps the values of each potential together, whatever characters its text holds', async () => {
		// Separate concatenations per column, or a separator inside an organism's name, would
		// shift one column against the others; each row is checked against SQLite here.
		const built = await buildCatalogue({
			groups: GROUPS,
			proteins: ORGANISMS.map((organism, i) => ({
				name: NAMES[i % NAMES.length]!,
				organism,
				vis:
					i === 2 ? { visibility: 'group' as const, group: 1 } : { visibility: 'public' as const }
			})),
			centres: ORGANISMS.map((_, i) => ({
				protein: ORGANISMS.length - 1 - i,
				label: LABELS[i % LABELS.length]!,
				kind: COFACTOR_KINDS[i]!,
				vis: { visibility: 'public' as const }
			})),
			potentials: Array.from({ length: 20 }, (_, i) => ({
				centre: (i * 3) % ORGANISMS.length,
				couple: i,
				mv: -300 + i * 17,
				ph: i % 3 === 0 ? null : 6 + i / 10,
				t: i % 4 === 0 ? null : 280 + i,
				method: POTENTIAL_METHODS[i % 3]!,
				vis:
					i % 5 === 0
						? { visibility: 'embargoed' as const, ended: i % 10 === 0, group: i % 2 }
						: { visibility: 'public' as const }
			}))
		});
		try {
			const c = await loadColumns(built.db);
			const rows = await built.db
				.selectFrom('potential')
				.select([
					'entry_id',
					'centre_entry_id',
					'protein_entry_id',
					'em_mv_she',
					'ph',
					'temperature_k',
					'cofactor_kind',
					'method',
					'organism',
					'public_from',
					'group_id'
				])
				.orderBy('entry_id')
				.execute();
			expect(c.n).toBe(20);
			expect(rows).toHaveLength(20);
			const loaded = Array.from({ length: c.n }, (_, i) => ({
				entry_id: c.entryId[i],
				centre_entry_id: c.centreId[i],
				protein_entry_id: c.proteinId[i],
				em_mv_she: c.em[i],
				ph: Number.isNaN(c.ph[i]) ? null : c.ph[i],
				temperature_k: Number.isNaN(c.temperature[i]) ? null : c.temperature[i],
				cofactor_kind: c.kinds[c.kind[i]!],
				method: c.methods[c.method[i]!],
				organism: c.organisms[c.organism[i]!],
				public_from: c.publicFrom[i] === Infinity ? null : new Date(c.publicFrom[i]!).toISOString(),
				group_id: c.group[i] === 0 ? null : c.group[i]
			}));
			expect(new Set(rows.map((r) => r.organism))).toEqual(new Set(ORGANISMS));
			expect(loaded).toEqual(rows);
		} finally {
			await built.remove();
		}
	});
});
