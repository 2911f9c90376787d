import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Migrator, sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';
import { ENTRY_KINDS } from '$lib/kinds';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenarioBeforePins } from '../support/demoBeforePins';

/*
 * Migration 0008 moves the kinds of entry from a CHECK on `entry.kind` into the table
 * `entry_kind`, rebuilding `entry` (which 19 foreign keys name). The database starts at 0007
 * with the demo scenario, so every table that names an entry has rows to keep pointing at.
 */
let db: Kysely<Database>;
let dir: string;
const provider = { getMigrations: async () => migrations };
type EntrySnapshot = { id: number; accession: string; kind: string; created_at: string }[];
let before: EntrySnapshot;
let counterBefore: number;

const entries = () =>
	db
		.selectFrom('entry')
		.select(['id', 'accession', 'kind', 'created_at'])
		.orderBy('id')
		.execute() as Promise<EntrySnapshot>;
const counter = async () =>
	Number(
		(
			await sql<{
				seq: number;
			}>`select seq from sqlite_sequence where name = 'entry'`.execute(db)
		).rows[0]?.seq
	);

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-0008-'));
	db = openDatabase(join(dir, 'test.sqlite'));
	const { error } = await new Migrator({ db, provider }).migrateTo(
		'0007_recompute_potential_groups'
	);
	if (error) throw error;
	await loadDemoScenarioBeforePins(db);
	// An allocation rolled back leaves the counter above the highest id: it must stay there.
	await sql`update sqlite_sequence set seq = seq + 5 where name = 'entry'`.execute(db);
	before = await entries();
	counterBefore = await counter();
	expect(await migrateToLatest(db)).toContain('0008_create_entry_kinds');
});
afterAll(async () => {
	await db.destroy();
	rmSync(dir, { recursive: true, force: true });
});

describe('migration 0008: the kinds of entry as rows', () => {
	it('keeps every entry, its id and accession, and the id counter', async () => {
		expect(before.length).toBeGreaterThan(50);
		expect(await entries()).toEqual(before);
		expect(await counter()).toBe(counterBefore);
	});

	it('leaves every foreign key pointing at an entry', async () => {
		expect((await sql`pragma foreign_key_check`.execute(db)).rows).toEqual([]);
		const fk = await sql<{ on: number }>`select 1 as "on" from pragma_foreign_keys`.execute(db);
		expect(fk.rows[0]?.on).toBe(1);
		const pointing = await sql<{ name: string }>`select m.name from sqlite_master m,
			pragma_foreign_key_list(m.name) f where m.type = 'table' and f."table" = 'entry'`.execute(db);
		expect(pointing.rows.length).toBeGreaterThanOrEqual(15);
	});

	it('refuses an entry of a kind that has no row, and the accession stays unique', async () => {
		await expect(
			db
				.insertInto('entry')
				.values({ accession: 'HL999990', kind: 'lambda' as never })
				.execute()
		).rejects.toThrow(/FOREIGN KEY/);
		await expect(
			db.insertInto('entry').values({ accession: before[0]!.accession, kind: 'protein' }).execute()
		).rejects.toThrow(/UNIQUE/);
	});
});

describe('the kinds of entry in the database', () => {
	it('has a row for every kind in the table of kinds (a new kind inserts its own in its migration)', async () => {
		const rows = await db.selectFrom('entry_kind').select('id').execute();
		expect(rows.map((r) => r.id).sort()).toEqual([...ENTRY_KINDS].sort());
	});
});
