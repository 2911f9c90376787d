import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isAccession } from '$lib/schemas/accession';
import { parseEntryInput } from '$lib/schemas/submission';
import type { SessionUser } from '$lib/server/auth/roles';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { PendingLimitError } from '$lib/server/curation/errors';
import { pendingRowCount } from '$lib/server/curation/pending';
import { decideSubmission } from '$lib/server/curation/reviews';
import { createDraft, submitForReview, withdrawSubmission } from '$lib/server/curation/submissions';
import type { Database } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

/**
 * The accession space cannot be used up, and one contributor cannot fill the registry with rows
 * nobody reviews: accessions widen past HL999999, and rows awaiting review are limited per
 * contributor.
 */
let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
let curator: SessionUser;
let centre: string;
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };
const origin = 'http://hopline.test';

const makeUser = (role: 'contributor' | 'curator', email: string) =>
	insertSessionUser(db, role, email);

function potential(reportedValue: number) {
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
	return parsed.entry;
}

const draft = (value: number, pendingRowsMax = 1000) =>
	db.transaction().execute((trx) =>
		createDraft(trx, contributor, {
			entry: potential(value),
			visibility: PUBLIC,
			changeNote: null,
			editAccession: null,
			pendingRowsMax
		})
	);

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await makeUser('contributor', 'c@lab.test');
	curator = await makeUser('curator', 'k@lab.test');
	const row = await db
		.selectFrom('potential')
		.select('centre_accession')
		.where('couple', '=', '[4Fe-4S]2+/1+')
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	centre = row.centre_accession;
});
afterAll(async () => remove());

describe('the accession space', () => {
	it('widens past HL999999 for forms and CSV commits alike, and the permalink resolves', async () => {
		// As if a million ids had been handed out (drafts and withdrawn batches keep theirs).
		await sql`update sqlite_sequence set seq = 999998 where name = 'entry'`.execute(db);
		const a = await draft(-251);
		const b = await draft(-252);
		expect(a.accession).toBe('HL999999');
		expect(b.accession).toBe('HL1000000');
		expect(isAccession(b.accession)).toBe(true);

		const csv = [
			'centreAccession,couple,reportedValue (mV),referenceElectrode,ph,temperatureK,method',
			`${centre},[4Fe-4S]2+/1+,-253,SHE,7,298.15,epr_titration`
		].join('\n');
		const check = await checkUpload(db, csv, 'potential', {
			viewer: null,
			limits: uploadCsvLimits
		});
		expect(check.errorCount).toBe(0);
		const committed = await db.transaction().execute((trx) =>
			commitUpload(trx, contributor, check, {
				filename: 'p.csv',
				visibility: PUBLIC,
				changeNote: null,
				origin,
				pendingRowsMax: 1000
			})
		);
		const entry = await db
			.selectFrom('entry_version')
			.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
			.select('entry.accession')
			.where('entry_version.submission_id', '=', committed.submissionId)
			.executeTakeFirstOrThrow();
		expect(entry.accession).toBe('HL1000001');

		await db
			.transaction()
			.execute((trx) => submitForReview(trx, contributor, b.submissionId, origin));
		await db
			.transaction()
			.execute((trx) =>
				decideSubmission(trx, curator, b.submissionId, { decision: 'approve', comment: '' }, origin)
			);
		const view = await getEntryView(db, 'HL1000000', undefined, null);
		expect(view.version).toBe(1);
	});
});

describe('rows awaiting review per contributor', () => {
	it('refuses a draft past the limit with a clear 409-class error, and counts withdrawn rows out', async () => {
		const pending = await pendingRowCount(db, contributor.id);
		expect(pending).toBeGreaterThan(0);
		const refused = await draft(-260, pending).catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(PendingLimitError);
		expect((refused as Error).message).toMatch(
			new RegExp(`you have ${pending} row\\(s\\) awaiting review .* the limit is ${pending}`)
		);
		const made = await draft(-261, pending + 1);
		await db
			.transaction()
			.execute((trx) => withdrawSubmission(trx, contributor, made.submissionId));
		expect(await pendingRowCount(db, contributor.id)).toBe(pending);
	});

	it('refuses a CSV commit that would pass the limit and writes nothing', async () => {
		const rows = Array.from(
			{ length: 5 },
			(_, i) => `${centre},[4Fe-4S]2+/1+,${-270 - i},SHE,7,298.15,epr_titration`
		);
		const csv = [
			'centreAccession,couple,reportedValue (mV),referenceElectrode,ph,temperatureK,method',
			...rows
		].join('\n');
		const check = await checkUpload(db, csv, 'potential', {
			viewer: null,
			limits: uploadCsvLimits
		});
		const pending = await pendingRowCount(db, contributor.id);
		const entriesBefore = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll<number>().as('n'))
			.executeTakeFirstOrThrow();
		const refused = await db
			.transaction()
			.execute((trx) =>
				commitUpload(trx, contributor, check, {
					filename: 'p.csv',
					visibility: PUBLIC,
					changeNote: null,
					origin,
					pendingRowsMax: pending + 4
				})
			)
			.catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(PendingLimitError);
		const entriesAfter = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll<number>().as('n'))
			.executeTakeFirstOrThrow();
		expect(entriesAfter.n).toBe(entriesBefore.n);
	});
});
