import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import {
	addVersion,
	approveVersion,
	createEntry,
	setEntryVisibility
} from '$lib/server/catalogue/entries';
import { getEntryView, compareVersions } from '$lib/server/catalogue/entryView';
import {
	EntryNotFoundError,
	InvalidEntryDataError,
	VersionStateError
} from '$lib/server/catalogue/errors';
import { listCentres } from '$lib/server/kinds/centre';
import { listDistances } from '$lib/server/kinds/distance';
import { listSpinRecords } from '$lib/server/kinds/spinRecord';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { decodeCursor } from '$lib/schemas/pagination';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';

let db: Kysely<Database>;
let remove: () => Promise<void>;
const page = { limit: 100, offset: 0 };

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
});
afterAll(async () => remove());

async function accessionOf(kind: string, where: (q: Kysely<Database>) => Promise<number>) {
	const id = await where(db);
	const row = await db
		.selectFrom('entry')
		.select(['accession', 'kind'])
		.where('id', '=', id)
		.executeTakeFirstOrThrow();
	expect(row.kind).toBe(kind);
	return row.accession;
}

describe('schema', () => {
	it('migrating an up-to-date database again changes nothing', async () => {
		expect(await migrateToLatest(db)).toEqual([]);
	});
	it('holds the demo scenario', async () => {
		const count = async (t: 'protein' | 'centre' | 'potential' | 'spin_record' | 'distance') =>
			Number(
				(
					await db
						.selectFrom(t)
						.select((eb) => eb.fn.countAll().as('n'))
						.executeTakeFirstOrThrow()
				).n
			);
		expect(await count('protein')).toBeGreaterThanOrEqual(3);
		expect(await count('centre')).toBeGreaterThanOrEqual(20);
		expect(await count('potential')).toBeGreaterThanOrEqual(40);
		expect(await count('distance')).toBeGreaterThanOrEqual(6);
	});
});

describe('approved versions are immutable', () => {
	it('the database refuses to change an approved version', async () => {
		await expect(
			sql`update entry_version set data = '{}' where status = 'approved' and id = (select min(id) from entry_version)`.execute(
				db
			)
		).rejects.toThrow(/immutable/);
	});
	it('the database refuses to delete an approved version', async () => {
		await expect(
			sql`delete from entry_version where status = 'approved'`.execute(db)
		).rejects.toThrow(/cannot be deleted/);
	});
	it('a change makes a new version; the old one stays readable', async () => {
		const accession = await accessionOf(
			'potential',
			async (d) =>
				(
					await d
						.selectFrom('potential')
						.select('entry_id')
						.where('couple', '=', 'Cu2+/Cu+')
						.executeTakeFirstOrThrow()
				).entry_id
		);
		const before = await getEntryView(db, accession, undefined, null);
		const versionId = await db.transaction().execute(async (trx) => {
			const id = await addVersion(
				trx,
				Number(accession.slice(2)),
				{ ...before.data, uncertaintyMv: 3 },
				{ status: 'submitted' }
			);
			await approveVersion(trx, id);
			return id;
		});
		expect(versionId).toBeGreaterThan(0);
		const latest = await getEntryView(db, accession, undefined, null);
		expect(latest.version).toBe(before.version + 1);
		expect(latest.data.uncertaintyMv).toBe(3);
		const old = await getEntryView(db, accession, before.version, null);
		expect(old.data).toEqual(before.data);
		const diff = await compareVersions(db, accession, before.version, latest.version, null);
		expect(diff.changes.map((c) => c.field)).toEqual(['uncertaintyMv']);
	});
	it('only a submitted version can be approved', async () => {
		const approvedId = (
			await db
				.selectFrom('entry_version')
				.select('id')
				.where('status', '=', 'approved')
				.executeTakeFirstOrThrow()
		).id;
		await expect(
			db.transaction().execute((trx) => approveVersion(trx, approvedId))
		).rejects.toThrow(VersionStateError);
	});
	it('a failed approval leaves nothing half-written', async () => {
		const before = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll().as('n'))
			.executeTakeFirstOrThrow();
		await expect(
			db.transaction().execute(async (trx) => {
				const entry = await createEntry(trx, { kind: 'centre' });
				const id = await addVersion(
					trx,
					entry.id,
					{ proteinAccession: 'HL999999', label: 'X', cofactorKind: 'fe4s4' },
					{ status: 'submitted' }
				);
				await approveVersion(trx, id);
			})
		).rejects.toThrow(InvalidEntryDataError);
		const after = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll().as('n'))
			.executeTakeFirstOrThrow();
		expect(after.n).toBe(before.n);
	});
	it('a couple that its centre cannot have is refused', async () => {
		const centre = await db
			.selectFrom('centre')
			.innerJoin('entry', 'entry.id', 'centre.entry_id')
			.select('entry.accession')
			.where('cofactor_kind', '=', 'heme_c')
			.executeTakeFirstOrThrow();
		await expect(
			db.transaction().execute(async (trx) => {
				const entry = await createEntry(trx, { kind: 'potential' });
				const id = await addVersion(
					trx,
					entry.id,
					{
						centreAccession: centre.accession,
						couple: '[4Fe-4S]2+/1+',
						reportedValue: -100,
						reportedUnit: 'mV',
						referenceElectrode: 'SHE',
						method: 'epr_titration',
						emMvShe: -100
					},
					{ status: 'submitted' }
				);
				await approveVersion(trx, id);
			})
		).rejects.toThrow(/not a couple of a heme_c centre/);
	});
});

describe('catalogue queries', () => {
	it('filters potentials by cofactor kind and Em range', async () => {
		const r = await listPotentials(db, { kind: ['fe4s4'], emMin: -300, emMax: -200 }, page, null);
		expect(r.total).toBeGreaterThan(0);
		for (const p of r.items) {
			expect(p.centre.cofactorKind).toBe('fe4s4');
			expect(p.emMvShe).toBeGreaterThanOrEqual(-300);
			expect(p.emMvShe).toBeLessThanOrEqual(-200);
		}
	});
	it('filters by pH and temperature', async () => {
		const r = await listPotentials(db, { phMin: 8, tMin: 300 }, page, null);
		for (const p of r.items) {
			expect(p.ph).toBeGreaterThanOrEqual(8);
			expect(p.temperatureK).toBeGreaterThanOrEqual(300);
		}
	});
	it('sorts and pages with a cursor', async () => {
		const first = await listPotentials(
			db,
			{},
			{ sort: 'em', order: 'desc', limit: 10, offset: 0 },
			null
		);
		expect(first.items.map((p) => p.emMvShe)).toEqual(
			[...first.items.map((p) => p.emMvShe)].sort((a, b) => b - a)
		);
		expect(first.nextCursor).not.toBeNull();
		const second = await listPotentials(
			db,
			{},
			{
				sort: 'em',
				order: 'desc',
				limit: 10,
				cursor: decodeCursor(first.nextCursor ?? '') ?? undefined
			},
			null
		);
		expect(second.items[0]?.emMvShe).toBeLessThanOrEqual(first.items.at(-1)?.emMvShe ?? 0);
		expect(new Set([...first.items, ...second.items].map((p) => p.accession)).size).toBe(20);
		expect(second.offset).toBe(10);
		// Back from the second page: the first page again.
		const back = await listPotentials(
			db,
			{},
			{
				sort: 'em',
				order: 'desc',
				limit: 10,
				cursor: decodeCursor(second.prevCursor ?? '') ?? undefined
			},
			null
		);
		expect(back.items.map((p) => p.accession)).toEqual(first.items.map((p) => p.accession));
		expect(back.offset).toBe(0);
		expect(back.prevCursor).toBeNull();
	});
	it('finds centres by words, prefixes and typos', async () => {
		const byProtein = await listPotentials(db, { q: 'tetraheme' }, page, null);
		expect(byProtein.total).toBe(8);
		const prefix = await listPotentials(db, { q: 'rieske' }, page, null);
		expect(prefix.items.every((p) => p.centre.cofactorKind === 'fe2s2_rieske')).toBe(true);
		const typo = await listPotentials(db, { q: 'hydrogenaze' }, page, null);
		expect(typo.total).toBeGreaterThan(0);
	});
	it('finds an entry by accession', async () => {
		const any = await listPotentials(db, {}, { ...page, limit: 1 }, null);
		const accession = any.items[0]?.accession ?? '';
		const r = await listPotentials(db, { q: accession.toLowerCase() }, page, null);
		expect(r.items.map((p) => p.accession)).toEqual([accession]);
	});
	it('copies a new centre version into its potentials', async () => {
		const centre = await db
			.selectFrom('potential')
			.select(['centre_accession', 'centre_entry_id'])
			.executeTakeFirstOrThrow();
		const current = await getEntryView(db, centre.centre_accession, undefined, null);
		await db.transaction().execute(async (trx) => {
			const id = await addVersion(
				trx,
				centre.centre_entry_id,
				{ ...current.data, label: 'Renamed site' },
				{ status: 'submitted' }
			);
			await approveVersion(trx, id);
		});
		const r = await listPotentials(db, { centre: centre.centre_accession }, page, null);
		expect(r.items.length).toBeGreaterThan(0);
		expect(r.items.every((p) => p.centre.label === 'Renamed site')).toBe(true);
	});
	it('keeps the search index current when a centre is approved', async () => {
		expect((await listCentres(db, { q: 'zymogenic' }, page, null)).total).toBe(0);
		const protein = await db
			.selectFrom('entry')
			.select('accession')
			.where('kind', '=', 'protein')
			.executeTakeFirstOrThrow();
		await db.transaction().execute(async (trx) => {
			const entry = await createEntry(trx, { kind: 'centre' });
			const id = await addVersion(
				trx,
				entry.id,
				{ proteinAccession: protein.accession, label: 'Zymogenic site', cofactorKind: 'fe4s4' },
				{ status: 'submitted' }
			);
			await approveVersion(trx, id);
		});
		expect((await listCentres(db, { q: 'zymogenic' }, page, null)).total).toBe(1);
	});
	it('hides embargoed entries until their date, and group-only ones from non-members', async () => {
		const row = await db
			.selectFrom('potential')
			.select(['entry_id', 'accession', 'centre_entry_id'])
			.executeTakeFirstOrThrow();
		const visibleTo = async (viewer: { groupIds: number[] } | null) =>
			(await listPotentials(db, { q: row.accession }, page, viewer)).total;
		const set = (entryId: number, change: Parameters<typeof setEntryVisibility>[2]) =>
			db.transaction().execute((trx) => setEntryVisibility(trx, entryId, change));

		await set(row.entry_id, {
			visibility: 'embargoed',
			embargoUntil: '2999-01-01T00:00:00.000Z',
			groupId: null
		});
		expect(await visibleTo(null)).toBe(0);
		await expect(getEntryView(db, row.accession, undefined, null)).rejects.toThrow(
			EntryNotFoundError
		);
		await set(row.entry_id, {
			visibility: 'embargoed',
			embargoUntil: '2000-01-01T00:00:00.000Z',
			groupId: null
		});
		expect(await visibleTo(null)).toBe(1);

		// A group-only centre hides its potentials too, except from the group's members.
		const { id: groupId } = await db
			.insertInto('research_group')
			.values({ slug: 'demo-lab', name: 'Demo lab' })
			.returning('id')
			.executeTakeFirstOrThrow();
		await set(row.centre_entry_id, { visibility: 'group', embargoUntil: null, groupId });
		expect(await visibleTo(null)).toBe(0);
		expect(await visibleTo({ groupIds: [groupId] })).toBe(1);
		await expect(getEntryView(db, row.accession, undefined, null)).rejects.toThrow(
			EntryNotFoundError
		);
		expect(
			(await getEntryView(db, row.accession, undefined, { groupIds: [groupId] })).accession
		).toBe(row.accession);
		await set(row.centre_entry_id, { visibility: 'public', embargoUntil: null, groupId: null });
		expect(await visibleTo(null)).toBe(1);

		await expect(
			set(row.entry_id, { visibility: 'embargoed', embargoUntil: null, groupId: null })
		).rejects.toThrow(InvalidEntryDataError);
	});
	it('lists spin records and distances with filters', async () => {
		const spins = await listSpinRecords(db, { kind: ['fe4s4'], spin: 0.5 }, page, null);
		expect(spins.total).toBeGreaterThan(0);
		expect(spins.items.every((s) => s.spinS === 0.5 && s.centre.cofactorKind === 'fe4s4')).toBe(
			true
		);
		const near = await listDistances(db, { edgeMax: 8 }, page, null);
		expect(near.items.every((d) => d.edgeToEdgeAngstrom <= 8)).toBe(true);
	});
	it('an unknown accession or version is not found', async () => {
		await expect(getEntryView(db, 'HL999999', undefined, null)).rejects.toThrow(EntryNotFoundError);
		const any = await db.selectFrom('entry').select('accession').executeTakeFirstOrThrow();
		await expect(getEntryView(db, any.accession, 99, null)).rejects.toThrow(
			/no approved version 99/
		);
	});
});
