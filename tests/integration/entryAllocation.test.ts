import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatAccession } from '$lib/schemas/accession';
import { parseEntryInput } from '$lib/schemas/submission';
import type { SessionUser } from '$lib/server/auth/roles';
import { allocateEntries } from '$lib/server/catalogue/entries';
import { createDraft } from '$lib/server/curation/submissions';
import type { Database } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

/**
 * One allocator makes every entry row: the form path and the CSV commit get consecutive
 * accessions from it, and each row is written with its final accession (never a placeholder
 * updated afterwards). A trigger installed here records every accession written to `entry`.
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
let centre: string;
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };
const origin = 'http://hopline.test';

async function draft(reportedValue: number) {
	const parsed = parseEntryInput('potential', {
		centreAccession: centre,
		couple: '[4Fe-4S]2+/1+',
		reportedValue,
		reportedUnit: 'mV',
		referenceElectrode: 'SHE',
		ph: 7,
		temperatureK: 298.15,
		method: 'epr_titration'
	});
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
	const entry = parsed.entry;
	return db.transaction().execute((trx) =>
		createDraft(trx, contributor, {
			entry,
			visibility: PUBLIC,
			changeNote: null,
			editAccession: null,
			pendingRowsMax: 1000
		})
	);
}

async function commitCsv(values: number[]) {
	const csv = [
		'centreAccession,couple,reportedValue (mV),referenceElectrode,ph,temperatureK,method',
		...values.map((v) => `${centre},[4Fe-4S]2+/1+,${v},SHE,7,298.15,epr_titration`)
	].join('\n');
	const check = await checkUpload(db, csv, 'potential', {
		viewer: null,
		limits: uploadCsvLimits
	});
	expect(check.errorCount).toBe(0);
	const { submissionId } = await db.transaction().execute((trx) =>
		commitUpload(trx, contributor, check, {
			filename: 'p.csv',
			visibility: PUBLIC,
			changeNote: null,
			origin,
			pendingRowsMax: 1000
		})
	);
	const rows = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select('entry.accession')
		.where('entry_version.submission_id', '=', submissionId)
		.orderBy('entry_version.row_number')
		.execute();
	return rows.map((r) => r.accession);
}

const accessionNumber = (a: string) => Number(a.slice(2));

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await insertSessionUser(db, 'contributor', 'c@lab.test');
	centre = (
		await db
			.selectFrom('potential')
			.select('centre_accession')
			.where('couple', '=', '[4Fe-4S]2+/1+')
			.orderBy('entry_id')
			.executeTakeFirstOrThrow()
	).centre_accession;
	// Every accession written to an entry row, by insert or by update.
	await sql`create table accession_written (entry_id integer, accession text, how text)`.execute(
		db
	);
	await sql`create trigger record_entry_insert after insert on entry begin
		insert into accession_written values (new.id, new.accession, 'insert'); end`.execute(db);
	await sql`create trigger record_entry_update after update of accession on entry begin
		insert into accession_written values (new.id, new.accession, 'update'); end`.execute(db);
});
afterAll(async () => remove());

describe('allocating entries', () => {
	it('gives forms and CSV commits consecutive accessions, each written once and final', async () => {
		const a = await draft(-301);
		const batch = await commitCsv([-302, -303]);
		const b = await draft(-304);
		const numbers = [a.accession, ...batch, b.accession].map(accessionNumber);
		const first = numbers[0] as number;
		expect(numbers).toEqual([first, first + 1, first + 2, first + 3]);

		const written = await sql<{
			entry_id: number;
			accession: string;
			how: string;
		}>`select entry_id, accession, how from accession_written order by rowid`.execute(db);
		expect(written.rows.map((r) => r.how)).toEqual(['insert', 'insert', 'insert', 'insert']);
		for (const r of written.rows) expect(r.accession).toBe(formatAccession(r.entry_id));
	});

	it('makes a large batch in order across its insert chunks, and never outside a transaction', async () => {
		const before = await sql<{
			n: number;
		}>`select count(*) as n from accession_written`.execute(db);
		const made = await db.transaction().execute((trx) =>
			allocateEntries(
				trx,
				Array.from({ length: 1201 }, () => ({ kind: 'protein' as const }))
			)
		);
		const first = made[0]?.id as number;
		expect(made.map((e) => e.id)).toEqual(Array.from({ length: 1201 }, (_, i) => first + i));
		expect(made.every((e) => e.accession === formatAccession(e.id))).toBe(true);
		const after = await sql<{ n: number }>`select count(*) as n from accession_written`.execute(db);
		expect(Number(after.rows[0]?.n) - Number(before.rows[0]?.n)).toBe(1201);

		await expect(allocateEntries(db, [{ kind: 'protein' }])).rejects.toThrow(
			/inside the transaction/
		);
		// The next form draft continues after the batch: ids are never handed out twice.
		const next = await draft(-305);
		expect(accessionNumber(next.accession)).toBe(first + 1201);
	});

	it('never reuses the id of an entry removed since (ids follow sqlite_sequence)', async () => {
		const made = await db
			.transaction()
			.execute((trx) => allocateEntries(trx, [{ kind: 'protein' }]));
		const id = made[0]?.id as number;
		await db.deleteFrom('entry').where('id', '=', id).execute();
		const next = await db
			.transaction()
			.execute((trx) => allocateEntries(trx, [{ kind: 'protein' }]));
		expect(next[0]?.id).toBe(id + 1);
	});
});
