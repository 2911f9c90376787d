import fc from 'fast-check';
import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '$lib/server/db/schema';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { COFACTOR_KINDS, POTENTIAL_METHODS } from '$lib/schemas/vocabulary';
import type { PotentialFilter, PotentialSort } from '$lib/schemas/catalogueQuery';
import { loadDemoScenario } from '$seed/load';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { normalisePotential, potentialInputSchema } from '$lib/schemas/potential';
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
