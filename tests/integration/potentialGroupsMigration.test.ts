import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Migrator, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';
import { openDatabase } from '$lib/server/db/connect';
import type { Database } from '$lib/server/db/schema';
import { loadDemoScenarioBeforePins } from '../support/demoBeforePins';

/*
 * Migration 0007 recomputes the one group of every potential row. Before it, the first group
 * along potential → centre → protein was stored, so a group-1 potential on a group-2 protein
 * was listed to group 1. The database starts at 0006 with rows as the old code wrote them.
 */
let db: Kysely<Database>;
let dir: string;
const provider = { getMigrations: async () => migrations };
const potentials: number[] = [];

async function groupOf(entryId: number): Promise<number | null> {
	const row = await db
		.selectFrom('potential')
		.select('group_id')
		.where('entry_id', '=', entryId)
		.executeTakeFirstOrThrow();
	return row.group_id;
}

async function revision(): Promise<number> {
	const row = await db
		.selectFrom('catalogue_state')
		.select('revision')
		.where('id', '=', 1)
		.executeTakeFirstOrThrow();
	return row.revision;
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-0007-'));
	db = openDatabase(join(dir, 'test.sqlite'));
	const { error } = await new Migrator({ db, provider }).migrateTo(
		'0006_structure_version_warnings'
	);
	if (error) throw error;
	await loadDemoScenarioBeforePins(db);
	await db
		.insertInto('research_group')
		.values([
			{ id: 1, slug: 'one', name: 'Group one' },
			{ id: 2, slug: 'two', name: 'Group two' }
		])
		.execute();
	// Two potentials on centres of two different proteins.
	const rows = await db
		.selectFrom('potential as p')
		.innerJoin('centre as c', 'c.entry_id', 'p.centre_entry_id')
		.select(['p.entry_id', 'c.protein_entry_id'])
		.orderBy('p.entry_id')
		.execute();
	const first = rows[0] as { entry_id: number; protein_entry_id: number };
	const second = rows.find((r) => r.protein_entry_id !== first.protein_entry_id) as typeof first;
	potentials.push(first.entry_id, second.entry_id);
	// Leaked as the old rule stored it: a group-1 potential on a group-2-only protein → 1.
	await db
		.updateTable('entry')
		.set({ visibility: 'group', group_id: 1 })
		.where('id', '=', first.entry_id)
		.execute();
	await db
		.updateTable('entry')
		.set({ visibility: 'group', group_id: 2 })
		.where('id', '=', first.protein_entry_id)
		.execute();
	await db
		.updateTable('potential')
		.set({ group_id: 1, public_from: null })
		.where('entry_id', '=', first.entry_id)
		.execute();
	// Right already: a group-1 potential on a public centre and protein → 1.
	await db
		.updateTable('entry')
		.set({ visibility: 'group', group_id: 1 })
		.where('id', '=', second.entry_id)
		.execute();
	await db
		.updateTable('potential')
		.set({ group_id: 1, public_from: null })
		.where('entry_id', '=', second.entry_id)
		.execute();
});
afterAll(async () => {
	await db.destroy();
	rmSync(dir, { recursive: true, force: true });
});

describe('migration 0007: one group per potential row, by the rule', () => {
	it('takes the group off a row whose hidden entries carry different groups, keeps a right one, and moves the revision', async () => {
		const [leaked, right] = potentials as [number, number];
		expect(await groupOf(leaked)).toBe(1);
		const before = await revision();
		// 0007 alone: later migrations move the revision for reasons of their own.
		const { results, error } = await new Migrator({ db, provider }).migrateTo(
			'0007_recompute_potential_groups'
		);
		expect(error).toBeUndefined();
		expect(results?.map((r) => r.migrationName)).toEqual(['0007_recompute_potential_groups']);
		expect(await groupOf(leaked)).toBeNull();
		expect(await groupOf(right)).toBe(1);
		expect(await revision()).toBe(before + 1);
	});
});
