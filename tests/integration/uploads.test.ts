import { readFileSync } from 'node:fs';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload, UploadHasErrorsError } from '$lib/server/uploads/commitUpload';
import { decideBatch } from '$lib/server/curation/reviews';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import { CsvLimitError } from '$lib/catalogue/csvRecords';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

let db: Kysely<Database>;
let remove: () => Promise<void>;
let contributor: SessionUser;
let curator: SessionUser;
const fixture = (name: string) => readFileSync(`tests/fixtures/csv/${name}`, 'utf8');
const PUBLIC = { visibility: 'public' as const, groupId: null, embargoUntil: null };
const options = { viewer: null, limits: uploadCsvLimits };
const origin = 'http://hopline.test';

const user = (role: 'contributor' | 'curator', email: string) => insertSessionUser(db, role, email);

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	contributor = await user('contributor', 'c@lab.test');
	curator = await user('curator', 'k@lab.test');
});
afterAll(async () => remove());

describe('checking a CSV file', () => {
	it('reads BOM, CRLF, quotes, the Unicode minus, units in header and cell, names for centres, blank rows', async () => {
		const check = await checkUpload(db, fixture('potentials-good.csv'), 'potential', options);
		expect(check.issues.filter((i) => i.severity === 'error')).toEqual([]);
		expect(check.rowCount).toBe(3);
		const data = check.entries.map((e) => e.entry.data as Record<string, unknown>);
		expect(data[0]).toMatchObject({
			centreAccession: 'HL000010',
			reportedValue: -262,
			reportedUnit: 'mV',
			emMvShe: -262,
			note: 'remeasured, second prep'
		});
		// −0.545 V vs SCE at 25 °C: +241 mV to SHE (the SCE offset at 25 °C, from memory: 241.2 mV).
		expect(data[1]).toMatchObject({
			reportedValue: -0.545,
			reportedUnit: 'V',
			referenceElectrode: 'SCE',
			temperatureK: 298.15
		});
		expect(data[1]?.emMvShe).toBeCloseTo(-545 + 241, -1);
		expect(data[2]).toMatchObject({ centreAccession: 'HL000030', ph: 9, temperatureK: 288 });
		expect(check.entries.map((e) => e.row)).toEqual([2, 3, 4]);
	});
	it('reads semicolon files with decimal commas, labels for vocabularies and °C in the header', async () => {
		const check = await checkUpload(db, fixture('potentials-semicolon.csv'), 'potential', options);
		expect(check.delimiter).toBe(';');
		expect(check.errorCount).toBe(0);
		const [a, b] = check.entries.map((e) => e.entry.data as Record<string, unknown>);
		expect(a).toMatchObject({
			reportedValue: -0.271,
			ph: 7.5,
			temperatureK: 293.15,
			method: 'epr_titration'
		});
		expect(b).toMatchObject({ reportedValue: -280.5, referenceElectrode: 'AgAgCl_sat' });
	});
	it('reads tab-separated files', async () => {
		const check = await checkUpload(db, fixture('potentials-tab.csv'), 'potential', options);
		expect(check.delimiter).toBe('\t');
		expect(check.entries).toHaveLength(1);
	});
	it('names the row, column, value and problem of each bad row, with a suggestion', async () => {
		const check = await checkUpload(db, fixture('potentials-bad.csv'), 'potential', options);
		const errors = check.issues.filter((i) => i.severity === 'error');
		expect(errors).toEqual([
			{
				row: 2,
				column: 'method',
				value: 'epr_titraton',
				message: expect.stringMatching(
					/^"epr_titraton" is not a method; did you mean "epr_titration"\? Allowed: /
				),
				severity: 'error'
			},
			{
				row: 3,
				column: 'centreAccession',
				value: 'HL000999',
				message: 'no centre HL000999 in the registry (or not visible to you)',
				severity: 'error'
			},
			{ row: 4, column: 'ph', value: '15', message: 'pH must be 0–14', severity: 'error' }
		]);
		expect(check.entries.map((e) => e.row)).toEqual([5]);
	});
	it('creates a protein named in an earlier row and finds an approved one by name', async () => {
		const check = await checkUpload(db, fixture('centres-new-protein.csv'), 'centre', options);
		expect(check.issues.filter((i) => i.severity === 'error')).toEqual([]);
		expect(check.proteins.map((p) => [p.row, p.data.name])).toEqual([
			[2, 'Demo upload oxidoreductase']
		]);
		expect(check.entries.map((e) => e.newProteinKey !== null)).toEqual([true, true, false]);
		expect((check.entries[1]?.entry.data as Record<string, unknown>).cofactorKind).toBe(
			'fe2s2_rieske'
		);
		expect((check.entries[2]?.entry.data as Record<string, unknown>).proteinAccession).toBe(
			'HL000029'
		);
	});
	it('flags duplicates inside the file as errors and of approved values as warnings', async () => {
		const line = 'HL000010,[4Fe-4S]2+/1+,-250,mV,SHE,7,298.15,epr_titration,20';
		const text = `centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method,uncertaintyMv\n${line}\n${line}\n`;
		const check = await checkUpload(db, text, 'potential', options);
		expect(check.issues.find((i) => i.severity === 'error')).toMatchObject({
			row: 3,
			message: 'repeats row 2'
		});
		expect(check.issues.find((i) => i.severity === 'warning')?.message).toMatch(
			/^already in the registry as HL\d{6}$/
		);
	});
	it('warns of spin records and distances already approved, in either centre order', async () => {
		const spin = await db
			.selectFrom('spin_record as r')
			.innerJoin('entry as e', 'e.id', 'r.entry_id')
			.innerJoin('entry as ce', 'ce.id', 'r.centre_entry_id')
			.select([
				'e.accession',
				'ce.accession as centre',
				'r.oxidation_level',
				'r.spin_s',
				'r.method',
				'r.temperature_k'
			])
			.where('e.visibility', '=', 'public')
			.executeTakeFirstOrThrow();
		const spins = await checkUpload(
			db,
			`centreAccession,oxidationLevel,spinS,method,temperatureK\n${spin.centre},${spin.oxidation_level},${spin.spin_s},${spin.method},${spin.temperature_k ?? ''}\n`,
			'spin_record',
			options
		);
		expect(spins.issues).toMatchObject([
			{ row: 2, severity: 'warning', message: `already in the registry as ${spin.accession}` }
		]);
		const distance = await db
			.selectFrom('distance as d')
			.innerJoin('entry as e', 'e.id', 'd.entry_id')
			.innerJoin('entry as a', 'a.id', 'd.centre_a_entry_id')
			.innerJoin('entry as b', 'b.id', 'd.centre_b_entry_id')
			.select([
				'e.accession',
				'a.accession as a',
				'b.accession as b',
				'd.edge_to_edge_a',
				'd.structure_id',
				'd.method'
			])
			.where('e.visibility', '=', 'public')
			.executeTakeFirstOrThrow();
		// The same pair named B first, and the structure in other letter case: still the same distance.
		const distances = await checkUpload(
			db,
			`centreAAccession,centreBAccession,edgeToEdgeA,structureId,method\n${distance.b},${distance.a},${distance.edge_to_edge_a},${distance.structure_id.toLowerCase()},${distance.method}\n`,
			'distance',
			options
		);
		expect(distances.issues).toMatchObject([
			{ row: 2, severity: 'warning', message: `already in the registry as ${distance.accession}` }
		]);
	});
	it('reads the ångström columns by their public names and by the names used before', async () => {
		const [a, b] = await db
			.selectFrom('centre as c')
			.innerJoin('entry as e', 'e.id', 'c.entry_id')
			.select('e.accession')
			.where('e.visibility', '=', 'public')
			.orderBy('e.id')
			.limit(2)
			.execute();
		for (const header of [
			'centreAAccession,centreBAccession,edge_to_edge_angstrom,centreToCentreAngstrom,structureId,method',
			'centreAAccession,centreBAccession,edgeToEdgeA,centre_to_centre_a,structureId,method'
		]) {
			const check = await checkUpload(
				db,
				`${header}\n${a!.accession},${b!.accession},9.5,12,NEWS,crystal_structure\n`,
				'distance',
				options
			);
			expect(
				check.issues.filter((i) => i.severity === 'error'),
				header
			).toEqual([]);
			expect(check.entries[0]?.entry.data).toMatchObject({ edgeToEdgeA: 9.5, centreToCentreA: 12 });
		}
		// A missing required column is named as templates name it.
		const missing = await checkUpload(
			db,
			`centreAAccession,centreBAccession,structureId,method\n${a!.accession},${b!.accession},S,crystal_structure\n`,
			'distance',
			options
		);
		expect(missing.issues.find((i) => i.row === 1)?.message).toMatch(
			/^missing column "edgeToEdgeAngstrom"/
		);
	});
	it('reports a missing required column once, and refuses files over the row limit', async () => {
		const check = await checkUpload(
			db,
			'couple,reportedValue\n[4Fe-4S]2+/1+,-250\n',
			'potential',
			options
		);
		expect(check.issues.filter((i) => i.row === 1).map((i) => i.column)).toEqual(['method']);
		// The missing column is named once, not again on every row; what the row can still give is asked of it.
		expect(check.issues.filter((i) => i.row === 2).map((i) => [i.column, i.message])).toEqual([
			['centreAccession', "required: the centre's accession, or the protein and centreLabel"],
			[
				'reportedUnit',
				expect.stringMatching(/^required: a reportedUnit column, a unit in the header/)
			],
			[
				'referenceElectrode',
				expect.stringMatching(/^required: a referenceElectrode column, or "vs SCE"/)
			]
		]);
		await expect(
			checkUpload(db, 'a\n1\n2\n3\n', 'potential', {
				viewer: null,
				limits: { ...uploadCsvLimits, maxRows: 2 }
			})
		).rejects.toBeInstanceOf(CsvLimitError);
	});
});

describe('committing and reviewing a batch', () => {
	it('refuses a file with errors and writes nothing', async () => {
		const check = await checkUpload(db, fixture('potentials-bad.csv'), 'potential', options);
		const before = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll().as('n'))
			.executeTakeFirstOrThrow();
		await expect(
			db.transaction().execute((trx) =>
				commitUpload(trx, contributor, check, {
					filename: 'bad.csv',
					visibility: PUBLIC,
					changeNote: null,
					origin,
					pendingRowsMax: 1000
				})
			)
		).rejects.toBeInstanceOf(UploadHasErrorsError);
		const after = await db
			.selectFrom('entry')
			.select((eb) => eb.fn.countAll().as('n'))
			.executeTakeFirstOrThrow();
		expect(after.n).toBe(before.n);
	});
	it('commits all rows as one submission, detects the same file again, and approves row by row', async () => {
		const text = fixture('centres-new-protein.csv');
		const check = await checkUpload(db, text, 'centre', options);
		const result = await db.transaction().execute((trx) =>
			commitUpload(trx, contributor, check, {
				filename: 'centres.csv',
				visibility: PUBLIC,
				changeNote: 'from our lab book',
				origin,
				pendingRowsMax: 1000
			})
		);
		expect(result.created).toBe(4);
		// The curators' notice, then the contributor's receipt.
		expect(result.mails.map((m) => m.to)).toEqual(['k@lab.test', 'c@lab.test']);
		const versions = await db
			.selectFrom('entry_version')
			.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
			.select([
				'entry.kind',
				'entry.accession',
				'entry_version.row_number',
				'entry_version.status',
				'entry_version.data'
			])
			.where('submission_id', '=', result.submissionId)
			.orderBy('entry_version.id')
			.execute();
		expect(versions.map((v) => [v.kind, v.row_number, v.status])).toEqual([
			['protein', 2, 'submitted'],
			['centre', 2, 'submitted'],
			['centre', 3, 'submitted'],
			['centre', 4, 'submitted']
		]);
		// Centres of the new protein name its reserved accession.
		expect(JSON.parse(versions[1]?.data ?? '{}').proteinAccession).toBe(versions[0]?.accession);

		const again = await checkUpload(db, text, 'centre', { ...options, uploaderId: contributor.id });
		expect(again.previousUpload?.submissionId).toBe(result.submissionId);

		await expect(
			db
				.transaction()
				.execute((trx) =>
					decideBatch(trx, curator, result.submissionId, { returnRows: [4], comment: '' }, origin)
				)
		).rejects.toThrow(/say what needs changing/);
		const outcome = await db.transaction().execute((trx) =>
			decideBatch(
				trx,
				curator,
				result.submissionId,
				// Begins with the row, as curators often write it: not prefixed a second time.
				{ returnRows: [4], comment: 'Row 4: Cluster C, check the ligation' },
				origin
			)
		);
		expect(outcome.approved).toHaveLength(3);
		expect(outcome.returned).toBe(1);
		const submission = await db
			.selectFrom('submission')
			.select('status')
			.where('id', '=', result.submissionId)
			.executeTakeFirstOrThrow();
		expect(submission.status).toBe('partially_approved');
		const centre = await db
			.selectFrom('centre')
			.innerJoin('entry', 'entry.id', 'centre.entry_id')
			.select(['centre.label', 'entry.accession'])
			.where('centre.label', '=', 'U2')
			.executeTakeFirstOrThrow();
		expect(centre.accession).toBe(versions[2]?.accession);
		expect(outcome.mails[0]?.text).toContain('  Row 4: Cluster C, check the ligation\n');
		expect(outcome.mails[0]?.text).not.toContain('Row 4: Row 4');
		const returnedComment = await db
			.selectFrom('submission_comment')
			.select(['entry_version_id', 'body'])
			.where('submission_id', '=', result.submissionId)
			.execute();
		expect(returnedComment).toHaveLength(1);
		const view = await loadSubmissionView(db, contributor, result.submissionId);
		expect(view.comments.map((c) => c.body)).toEqual(['Row 4: Cluster C, check the ligation']);
	});
});

describe('row comments of a batch decision', () => {
	it('say their row once, however the curator began the comment', async () => {
		const { withRowPrefix } = await import('$lib/server/curation/rowComment');
		expect(withRowPrefix(3, 'check the units')).toBe('Row 3: check the units');
		expect(withRowPrefix(3, 'Row 3: check the units')).toBe('Row 3: check the units');
		expect(withRowPrefix(3, 'row 3 - check the units')).toBe('row 3 - check the units');
		// Another row's number is part of the comment: this row is still named.
		expect(withRowPrefix(3, 'Row 4: same as here')).toBe('Row 3: Row 4: same as here');
		expect(withRowPrefix(3, 'Row 30: no')).toBe('Row 3: Row 30: no');
	});

	it('read "row: comment" lines, ranges included, and name a bad line', async () => {
		const { batchDecisionSchema } = await import('$lib/schemas/submission');
		expect(
			batchDecisionSchema.parse({
				returnRows: '2, 5-6',
				rowComments: '3: buffer?\n7-8) sign\nRow 9: units?\nrows 10-11: which pH?'
			})
		).toEqual({
			returnRows: [2, 5, 6],
			rowComments: {
				3: 'buffer?',
				7: 'sign',
				8: 'sign',
				9: 'units?',
				10: 'which pH?',
				11: 'which pH?'
			},
			comment: ''
		});
		const bad = batchDecisionSchema.safeParse({ rowComments: 'row four: sign' });
		expect(bad.success || bad.error.issues[0]?.message).toBe(
			'line 1: expected "row: comment", e.g. "4: check the ligation"'
		);
	});
});
