import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Migrator, sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrations } from '$migrations/index';
import * as m0006 from '$migrations/0006_structure_version_warnings';
import { checkTypicalRange } from '$lib/catalogue/typicalRanges';
import { parseStoredWarnings, type VersionWarning } from '$lib/schemas/versionWarning';
import type { SessionUser } from '$lib/server/auth/roles';
import { allocateEntries } from '$lib/server/catalogue/entries';
import { batchFlagCounts, loadBatchRows } from '$lib/server/curation/batchRows';
import { listQueue } from '$lib/server/curation/submissionLists';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import type { Database } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { insertSessionUser } from '../support/users';
import { loadDemoScenarioBeforePins } from '../support/demoBeforePins';

/**
 * Version warnings are stored as structured JSON and counted by kind. Migration 0006 turns the
 * English sentences stored before it into that form; the queue's counts stay what they were.
 * The database starts at 0005 with rows as the upload checks wrote them then.
 */
let db: Kysely<Database>;
let dir: string;
let contributor: SessionUser;
const origin = 'http://hopline.test';
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };
const provider = { getMigrations: async () => migrations };

// Sentences exactly as the upload checks wrote them before 0006 (src/lib/server/kinds before
// the change: `${range.message} (range source: ${source})`, "conflicts with approved …",
// "already in the registry as …").
const range = checkTypicalRange('fe4s4', '[4Fe-4S]2+/1+', 250);
if (!range) throw new Error('+250 mV must be outside the [4Fe-4S]2+/1+ range');
const OLD_RANGE = `${range.message} (range source: ${range.range.source})`;
const OLD_CONFLICT =
	'conflicts with approved HL000012: differs by 500 mV, more than the combined uncertainty of 21 mV';
const OLD_DUPLICATE = 'already in the registry as HL000013';
const OLD_OTHER = 'a note from a check that no longer exists';

/** What the queue counted before 0006: rows whose text matched, per submission. */
async function oldCounts(submissionId: number) {
	const r = await sql<{ range: number; conflicts: number }>`select
		count(case when warnings like '%typical range%' then 1 end) as range,
		count(case when warnings like '%conflicts with%' then 1 end) as conflicts
		from entry_version where submission_id = ${submissionId}`.execute(db);
	return { rangeWarnings: Number(r.rows[0]?.range), conflicts: Number(r.rows[0]?.conflicts) };
}

let batchId: number;
const versionIds: Record<string, number> = {};

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-test-'));
	db = openDatabase(join(dir, 'test.sqlite'));
	const { error } = await new Migrator({ db, provider }).migrateTo('0005_create_backup_log');
	if (error) throw error;
	await loadDemoScenarioBeforePins(db);
	contributor = await insertSessionUser(db, 'contributor', 'c@lab.test');

	// A CSV batch committed before 0006: one submission, rows with old-style warnings.
	const rows: [string, 'potential' | 'centre' | 'distance', string[] | null, string][] = [
		['range', 'potential', [OLD_RANGE], 'submitted'],
		['range+conflict', 'potential', [OLD_RANGE, OLD_CONFLICT], 'submitted'],
		['two conflicts', 'potential', [OLD_CONFLICT, OLD_CONFLICT], 'submitted'],
		['duplicate', 'potential', [OLD_DUPLICATE], 'submitted'],
		['centre duplicate', 'centre', [OLD_DUPLICATE], 'submitted'],
		['other', 'distance', [OLD_OTHER], 'submitted'],
		['clean', 'potential', null, 'submitted'],
		['approved range', 'potential', [OLD_RANGE], 'approved']
	];
	await db.transaction().execute(async (trx) => {
		({ id: batchId } = await trx
			.insertInto('submission')
			.values({
				channel: 'csv',
				status: 'submitted',
				title: 'CSV batch from before 0006',
				submitted_by: contributor.id,
				content_sha256: 'f'.repeat(64),
				row_count: rows.length,
				submitted_at: '2025-01-01T00:00:00.000Z'
			})
			.returning('id')
			.executeTakeFirstOrThrow());
		const entries = await allocateEntries(
			trx,
			rows.map(([, kind]) => ({ kind, createdBy: contributor.id }))
		);
		for (const [i, [name, , warnings, status]] of rows.entries()) {
			const { id } = await trx
				.insertInto('entry_version')
				.values({
					entry_id: (entries[i] as { id: number }).id,
					version: status === 'approved' ? 1 : null,
					status: status as 'submitted' | 'approved',
					data: '{}',
					submission_id: batchId,
					created_by: contributor.id,
					row_number: i + 2,
					warnings: warnings ? JSON.stringify(warnings) : null
				})
				.returning('id')
				.executeTakeFirstOrThrow();
			versionIds[name] = id;
		}
	});
});
afterAll(async () => {
	await db.destroy();
	rmSync(dir, { recursive: true, force: true });
});

async function storedWarnings(name: string): Promise<VersionWarning[]> {
	const row = await db
		.selectFrom('entry_version')
		.select('warnings')
		.where('id', '=', versionIds[name] as number)
		.executeTakeFirstOrThrow();
	return parseStoredWarnings(row.warnings);
}

describe('migration 0006: warnings as structured JSON', () => {
	let before: { rangeWarnings: number; conflicts: number };

	it('classifies each stored sentence, keeping its message, and the queue counts stay', async () => {
		before = await oldCounts(batchId);
		expect(before).toEqual({ rangeWarnings: 3, conflicts: 2 });
		expect(await migrateToLatest(db)).toContain('0006_structure_version_warnings');

		expect(await storedWarnings('range')).toEqual([
			{
				kind: 'range',
				field: 'reportedValue',
				message: range.message,
				source: range.range.source
			}
		]);
		expect((await storedWarnings('range+conflict')).map((w) => w.kind)).toEqual([
			'range',
			'conflict'
		]);
		expect((await storedWarnings('two conflicts'))[0]).toEqual({
			kind: 'conflict',
			field: 'reportedValue',
			message: OLD_CONFLICT,
			accession: 'HL000012'
		});
		expect(await storedWarnings('duplicate')).toEqual([
			{ kind: 'duplicate', field: 'reportedValue', message: OLD_DUPLICATE, accession: 'HL000013' }
		]);
		expect((await storedWarnings('centre duplicate'))[0]?.field).toBe('label');
		expect(await storedWarnings('other')).toEqual([
			{ kind: 'other', field: '', message: OLD_OTHER }
		]);
		expect(await storedWarnings('clean')).toEqual([]);
		// An approved version's warnings are converted too, and it stays frozen afterwards.
		expect((await storedWarnings('approved range'))[0]?.kind).toBe('range');
		await expect(
			db
				.updateTable('entry_version')
				.set({ warnings: null })
				.where('id', '=', versionIds['approved range'] as number)
				.execute()
		).rejects.toThrow(/approved entry versions are immutable/);

		const { rangeWarnings, conflicts } = await batchFlagCounts(db, batchId);
		expect({ rangeWarnings, conflicts }).toEqual(before);
		const [queued] = await listQueue(db, { status: 'submitted' });
		expect(queued).toMatchObject({ id: batchId, ...before });
	});

	it('shows the rows as before (the same text), kinds apart', async () => {
		const page = await loadBatchRows(db, batchId, { offset: 0, limit: 50, flagged: true });
		expect(page.total).toBe(7);
		const rangeRow = page.rows.find((r) => r.versionId === versionIds.range);
		expect(rangeRow?.warnings[0]?.kind).toBe('range');
	});

	it('keeps converted lists when run again, and goes back to the same sentences', async () => {
		const after = await db
			.selectFrom('entry_version')
			.select(['id', 'warnings'])
			.orderBy('id')
			.execute();
		await m0006.up(db);
		expect(
			await db.selectFrom('entry_version').select(['id', 'warnings']).orderBy('id').execute()
		).toEqual(after);

		await m0006.down(db);
		const back = await db
			.selectFrom('entry_version')
			.select('warnings')
			.where('id', '=', versionIds['range+conflict'] as number)
			.executeTakeFirstOrThrow();
		expect(JSON.parse(back.warnings as string)).toEqual([OLD_RANGE, OLD_CONFLICT]);
		await m0006.up(db);
		expect(
			await db.selectFrom('entry_version').select(['id', 'warnings']).orderBy('id').execute()
		).toEqual(after);
	});
});

describe('warnings of a new upload', () => {
	it('are stored by kind, shown in the same words, and counted by the queue', async () => {
		const line = (value: number, method: string, u: number, ph = 7) =>
			`HL000010,[4Fe-4S]2+/1+,${value},mV,SHE,${ph},298.15,${method},${u}`;
		const csv = [
			'centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method,uncertaintyMv',
			line(-250, 'epr_titration', 20),
			line(250, 'protein_film_voltammetry', 5),
			line(-400, 'protein_film_voltammetry', 5)
		].join('\n');
		const check = await checkUpload(db, csv, 'potential', {
			viewer: null,
			limits: uploadCsvLimits
		});
		expect(check.errorCount).toBe(0);
		const texts = check.issues.map((i) => i.message);
		expect(texts).toContainEqual(expect.stringMatching(/^already in the registry as HL\d{6}$/));
		expect(texts).toContainEqual(expect.stringMatching(/typical range .* \(range source: .+\)$/));
		const { submissionId } = await db.transaction().execute((trx) =>
			commitUpload(trx, contributor, check, {
				filename: 'w.csv',
				visibility: PUBLIC,
				changeNote: null,
				origin,
				pendingRowsMax: 1000
			})
		);
		const page = await loadBatchRows(db, submissionId, { offset: 0, limit: 50, flagged: false });
		const byRow = new Map(page.rows.map((r) => [r.row, r.warnings]));
		expect(byRow.get(2)).toEqual([
			expect.objectContaining({ kind: 'duplicate', field: 'reportedValue' })
		]);
		const second = byRow.get(3) ?? [];
		expect(second.map((w) => w.kind)).toContain('range');
		expect(second.map((w) => w.kind)).toContain('conflict');
		expect(second.find((w) => w.kind === 'conflict')?.accession).toMatch(/^HL\d{6}$/);

		// The queue's counts are those of the stored kinds: rows with a range warning, rows
		// with a conflict.
		const rows = page.rows.map((r) => r.warnings.map((w) => w.kind));
		const expected = {
			rangeWarnings: rows.filter((k) => k.includes('range')).length,
			conflicts: rows.filter((k) => k.includes('conflict')).length
		};
		expect(expected.rangeWarnings).toBeGreaterThan(0);
		expect(expected.conflicts).toBeGreaterThan(0);
		const queued = (await listQueue(db, { status: 'submitted' })).find(
			(q) => q.id === submissionId
		);
		expect(queued).toMatchObject(expected);
		// The curators' "warnings" and "conflicts" filters find it.
		expect(
			(await listQueue(db, { status: 'submitted', flag: 'conflicts' })).map((q) => q.id)
		).toContain(submissionId);
	});
});
