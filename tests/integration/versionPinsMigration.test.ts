import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Migrator, sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';
import { KINDS, type EntryKind } from '$lib/kinds';
import { addVersion, approveVersion, createEntry } from '$lib/server/catalogue/entries';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { openDatabase } from '$lib/server/db/connect';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenario } from '$seed/load';
import { potentialAtPh7 } from '../support/largeCentre';

/*
 * Migration 0009 pins the references of versions approved before it, by the rule it writes out:
 * the referenced entry's latest version approved at or before the referencing version. Its
 * oracle is the approval path itself: the demo scenario and a history of renames interleaved
 * with the entries that name them are approved with 0009 in place (each approval pins what it
 * saw), then 0009 is rolled back, which leaves the database as one at 0008 with the same
 * catalogue, and run again. The backfill must give back every pin, and every version the same
 * title and references. Only migrations up to 0009 are run, so that later ones do not take part.
 */
let db: Kysely<Database>;
let dir: string;
const MIGRATION = '0009_pin_version_references';
const upTo = Object.fromEntries(Object.entries(migrations).filter(([name]) => name <= MIGRATION));
const migrator = () => new Migrator({ db, provider: { getMigrations: async () => upTo } });

type Pin = {
	entry_version_id: number;
	field: string;
	referenced_entry_id: number;
	referenced_version: number;
};
const pins = () =>
	db
		.selectFrom('entry_version_reference')
		.selectAll()
		.orderBy('entry_version_id')
		.orderBy('field')
		.execute() as Promise<Pin[]>;

/** Every approved version's frozen part, as the entry page and API show it. */
async function frozenViews(): Promise<string[]> {
	const versions = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select(['entry.accession', 'entry_version.version'])
		.where('entry_version.status', '=', 'approved')
		.orderBy('entry_version.id')
		.execute();
	const views = [];
	for (const v of versions) {
		const { live: _live, ...frozen } = await getEntryView(
			db,
			v.accession,
			v.version as number,
			null
		);
		views.push(JSON.stringify(frozen));
	}
	return views;
}

const revision = async () =>
	(await db.selectFrom('catalogue_state').select('revision').executeTakeFirstOrThrow()).revision;

async function approveAt(
	kind: EntryKind,
	data: unknown,
	approvedAt: string,
	existing?: { id: number; accession: string }
): Promise<{ id: number; accession: string }> {
	return db.transaction().execute(async (trx) => {
		const entry = existing ?? (await createEntry(trx, { kind }));
		const versionId = await addVersion(trx, entry.id, data, {
			status: 'submitted',
			visibility: null
		});
		await approveVersion(trx, versionId, { approvedAt });
		return entry;
	});
}

const protein = (name: string) =>
	KINDS.protein.schema.parse({ name, organism: 'Testus migrans', structureIds: ['M1'] });
const centre = (proteinAccession: string, label: string) =>
	KINDS.centre.schema.parse({ proteinAccession, label, cofactorKind: 'fe4s4', ligation: 'Cys4' });

let livePins: Pin[];
let liveViews: string[];
let revisionBefore: number;
let history: { p: { accession: string }; c: { accession: string }; late: { accession: string } };

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-0009-'));
	db = openDatabase(join(dir, 'test.sqlite'));
	const { error } = await migrator().migrateTo(MIGRATION);
	if (error) throw error;
	await loadDemoScenario(db);

	// Renames interleaved with the entries that name them, each approval at its own time.
	const p = await approveAt('protein', protein('Migrating reductase'), '2030-01-01T00:00:00.000Z');
	const c = await approveAt('centre', centre(p.accession, 'M1'), '2030-01-02T00:00:00.000Z');
	await approveAt('protein', protein('Renamed reductase'), '2030-01-03T00:00:00.000Z', p);
	await approveAt(
		'potential',
		potentialAtPh7(c.accession, '[4Fe-4S]2+/1+', -320),
		'2030-01-04T00:00:00.000Z'
	);
	await approveAt('centre', centre(p.accession, 'M1b'), '2030-01-05T00:00:00.000Z', c);
	await approveAt(
		'spin_record',
		KINDS.spin_record.schema.parse({
			centreAccession: c.accession,
			oxidationLevel: '[4Fe-4S]1+',
			spinS: 0.5,
			gValues: [2.04, 1.93, 1.89],
			temperatureK: 12,
			method: 'cw_epr_x'
		}),
		'2030-01-06T00:00:00.000Z'
	);
	const c2 = await approveAt('centre', centre(p.accession, 'M2'), '2030-01-07T00:00:00.000Z');
	await approveAt(
		'distance',
		KINDS.distance.schema.parse({
			centreAAccession: c.accession,
			centreBAccession: c2.accession,
			edgeToEdgeA: 9.5,
			structureId: 'M1',
			method: 'crystal_structure'
		}),
		'2030-01-08T00:00:00.000Z'
	);
	// A clock set back: the centre's approval time is earlier than its protein's. The approval
	// pinned the protein's one version; the rule finds none at or before, and pins the first.
	const late = await approveAt('protein', protein('Late protein'), '2031-01-01T00:00:00.000Z');
	await approveAt('centre', centre(late.accession, 'L1'), '2029-06-01T00:00:00.000Z');
	history = { p, c, late };

	livePins = await pins();
	liveViews = await frozenViews();

	const down = await migrator().migrateTo('0008_create_entry_kinds');
	if (down.error) throw down.error;
	const table = await sql<{ n: number }>`select count(*) as n from sqlite_master
		where name = 'entry_version_reference'`.execute(db);
	expect(table.rows[0]?.n).toBe(0);
	revisionBefore = await revision();

	const up = await migrator().migrateTo(MIGRATION);
	if (up.error) throw up.error;
}, 60_000);

afterAll(async () => {
	await db.destroy();
	rmSync(dir, { recursive: true, force: true });
});

describe('migration 0009: pinning the references of versions approved before it', () => {
	it('pins every reference as the approvals did', async () => {
		// Each centre, potential, spin record and distance names one to three entries.
		expect(livePins.length).toBeGreaterThan(150);
		expect(await pins()).toEqual(livePins);
	});

	it('pins by approval time: a centre approved before a rename names the protein before it', async () => {
		const named = await db
			.selectFrom('entry_version_reference as r')
			.innerJoin('entry_version as v', 'v.id', 'r.entry_version_id')
			.innerJoin('entry as e', 'e.id', 'v.entry_id')
			.innerJoin('entry as re', 're.id', 'r.referenced_entry_id')
			.select(['v.version', 'r.referenced_version'])
			.where('e.accession', '=', history.c.accession)
			.where('re.accession', '=', history.p.accession)
			.orderBy('v.version')
			.execute();
		expect(named).toEqual([
			{ version: 1, referenced_version: 1 },
			{ version: 2, referenced_version: 2 }
		]);
		const centreV1 = await getEntryView(db, history.c.accession, 1, null);
		expect(centreV1.title).toBe('M1 ([4Fe-4S]) · Migrating reductase');
	});

	it('gives every version the same title and references as before', async () => {
		expect(await frozenViews()).toEqual(liveViews);
	});

	it('moves the catalogue revision, so that answers kept before it are not served', async () => {
		expect(await revision()).toBe(revisionBefore + 1);
	});
});
