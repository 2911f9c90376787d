import fc from 'fast-check';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import '../support/fast-check';
import type { Database } from '$lib/server/db/schema';
import { UPLOAD_COLUMNS } from '$lib/catalogue/uploadColumns';
import { UPLOAD_KINDS } from '$lib/kinds';
import { checkUpload, type UploadCheck } from '$lib/server/uploads/checkUpload';
import {
	commitUpload,
	UploadHasErrorsError,
	type CommitResult
} from '$lib/server/uploads/commitUpload';
import { CsvLimitError } from '$lib/catalogue/csvRecords';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';
import type { SessionUser } from '$lib/server/auth/roles';

// Random CSV files: the check never throws, and a commit writes all rows or none.
let db: Kysely<Database>;
let remove: () => Promise<void>;
let user: SessionUser;

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	user = await insertSessionUser(db, 'contributor', 'fuzz@lab.test');
});
afterAll(async () => remove());

const cellArb = fc.oneof(
	fc.string({ maxLength: 12 }),
	fc.constantFrom(
		'',
		'-250',
		'−0,3',
		'25 °C',
		'1e309',
		'NaN',
		'"',
		'""',
		'HL000010',
		'HL999999',
		'[4Fe-4S]2+/1+',
		'SHE',
		'mV',
		'V',
		'epr_titration',
		'fe4s4',
		'7.0',
		'\r',
		'\n',
		';',
		'\t',
		'\uFEFF'
	),
	fc.double().map(String),
	fc.integer().map(String)
);

const csvArb = fc
	.record({
		kind: fc.constantFrom(...UPLOAD_KINDS),
		delimiter: fc.constantFrom(',', ';', '\t'),
		headerPick: fc.array(fc.nat(), { maxLength: 14 }),
		junkHeaders: fc.array(fc.string({ maxLength: 8 }), { maxLength: 2 }),
		rows: fc.array(fc.array(cellArb, { maxLength: 16 }), { maxLength: 12 }),
		eol: fc.constantFrom('\n', '\r\n'),
		quoteAll: fc.boolean()
	})
	.map((r) => {
		const names = UPLOAD_COLUMNS[r.kind].map((c) => c.name);
		const headers = [
			...r.headerPick.map((i) => names[i % names.length] as string),
			...r.junkHeaders
		];
		const q = (c: string) => (r.quoteAll ? `"${c.replace(/"/g, '""')}"` : c);
		const text = [headers, ...r.rows].map((row) => row.map(q).join(r.delimiter)).join(r.eol);
		return { kind: r.kind, text };
	});

const counts = async () =>
	Number(
		(
			await db
				.selectFrom('entry_version')
				.select((eb) => eb.fn.countAll().as('n'))
				.executeTakeFirstOrThrow()
		).n
	);

const commit = (check: UploadCheck) =>
	db.transaction().execute((trx) =>
		commitUpload(trx, user, check, {
			filename: 'fuzz.csv',
			visibility: { visibility: 'public', groupId: null, embargoUntil: null },
			changeNote: null,
			origin: 'http://x.test',
			pendingRowsMax: 1_000_000
		})
	);

/** The commit's outcome: its result, or the error it was refused with (any other error fails). */
async function tryCommit(check: UploadCheck): Promise<CommitResult | UploadHasErrorsError> {
	try {
		return await commit(check);
	} catch (e) {
		if (e instanceof UploadHasErrorsError) return e;
		throw e;
	}
}

describe('random, mostly malformed CSV files', () => {
	it('are checked without an exception; a file with errors is refused whole, any other is committed whole', async () => {
		let refused = 0;
		await fc.assert(
			fc.asyncProperty(csvArb, async ({ kind, text }) => {
				let check;
				try {
					check = await checkUpload(db, text, kind, {
						viewer: null,
						limits: { ...uploadCsvLimits, maxRows: 50 }
					});
				} catch (e) {
					if (e instanceof CsvLimitError) return;
					throw e;
				}
				const lines = text.split(/\r\n|\n|\r/).length;
				for (const i of check.issues) {
					expect(i.row).toBeGreaterThanOrEqual(1);
					expect(i.row).toBeLessThanOrEqual(lines);
				}
				const hasError = check.issues.some((i) => i.severity === 'error');
				const before = await counts();
				const outcome = await tryCommit(check);
				const after = await counts();
				if (hasError) {
					refused++;
					expect(outcome).toBeInstanceOf(UploadHasErrorsError);
					expect((outcome as UploadHasErrorsError).message).toMatch(
						/^the file has \d+ error\(s\); fix them and check it again before committing$/
					);
					expect(after).toBe(before);
				} else {
					expect(outcome).not.toBeInstanceOf(Error);
					expect(after - before).toBe(check.entries.length + check.proteins.length);
				}
			}),
			{ numRuns: 300 }
		);
		expect(refused).toBeGreaterThan(0);
	});
});

/*
 * Well-formed potential files with recorded corruptions: every row starts valid (a public fe4s4
 * centre of the demo scenario, a value of its own so that no two rows repeat), and the generator
 * corrupts some rows in one cell each, noting the row and column and the error expected there.
 * The expected errors are what the generator wrote down, not a count of what the check found.
 */
const POTENTIAL_COLUMNS = [
	'centreAccession',
	'couple',
	'reportedValue',
	'reportedUnit',
	'referenceElectrode',
	'ph',
	'temperatureK',
	'method',
	'uncertaintyMv'
] as const;
type PotentialColumn = (typeof POTENTIAL_COLUMNS)[number];

/** One corruption per kind: the cell it writes and the error the check must name for it. */
const CORRUPTIONS: Record<string, { column: PotentialColumn; text: string; message: RegExp }> = {
	misspeltMethod: {
		column: 'method',
		text: 'epr_titraton',
		message: /^"epr_titraton" is not a method; did you mean "epr_titration"\?/
	},
	unknownCentre: {
		column: 'centreAccession',
		text: 'HL000999',
		message: /^no centre HL000999 in the registry \(or not visible to you\)$/
	},
	phOutOfRange: { column: 'ph', text: '15', message: /^pH must be 0–14$/ },
	notANumber: { column: 'reportedValue', text: 'abc', message: /^expected a number/ },
	unknownUnit: { column: 'reportedUnit', text: 'furlong', message: /is not a unit as reported/ },
	unknownElectrode: {
		column: 'referenceElectrode',
		text: 'Hg/HgO',
		message: /^"Hg\/HgO" is not a reference electrode/
	},
	wrongCouple: {
		column: 'couple',
		text: '[2Fe-2S]2+/1+',
		message: /^"\[2Fe-2S\]2\+\/1\+" is not a couple of a fe4s4 centre/
	},
	negativeTemperature: { column: 'temperatureK', text: '-5', message: /^expected a temperature/ },
	negativeUncertainty: { column: 'uncertaintyMv', text: '-3', message: /small/i }
};
const CORRUPTION_NAMES = Object.keys(CORRUPTIONS);

interface ExpectedError {
	row: number;
	column: string;
	message: RegExp;
}

const rowSpec = fc.record({
	centre: fc.constantFrom('HL000010', 'HL000011', 'HL000012'),
	ph: fc.integer({ min: 5, max: 9 }),
	method: fc.constantFrom('epr_titration', 'optical_titration'),
	// null: the row stays valid; 'repeat': it copies the last valid row before it.
	corruption: fc.option(fc.constantFrom(...CORRUPTION_NAMES, 'repeat'), { freq: 2 }),
	blankLinesBefore: fc.nat({ max: 1 }),
	pad: fc.boolean()
});

const goodFileArb = fc
	.record({
		rows: fc.array(rowSpec, { minLength: 1, maxLength: 6 }),
		order: fc.shuffledSubarray([...POTENTIAL_COLUMNS], { minLength: POTENTIAL_COLUMNS.length }),
		delimiter: fc.constantFrom(',', ';', '\t'),
		eol: fc.constantFrom('\n', '\r\n'),
		quoteAll: fc.boolean(),
		bom: fc.boolean()
	})
	.map((f) => {
		const q = (c: string) => (f.quoteAll ? `"${c.replace(/"/g, '""')}"` : c);
		const lines = [f.order.map(q).join(f.delimiter)];
		const expected: ExpectedError[] = [];
		const committed: { row: number; reportedValue: number }[] = [];
		let lastValid: { row: number; cells: Record<PotentialColumn, string> } | null = null;
		f.rows.forEach((r, i) => {
			for (let b = 0; b < r.blankLinesBefore; b++) lines.push('');
			const row = lines.length + 1; // as a spreadsheet numbers it: the header is row 1
			let cells: Record<PotentialColumn, string> = {
				centreAccession: r.centre,
				couple: '[4Fe-4S]2+/1+',
				reportedValue: String(-200 - i),
				reportedUnit: 'mV',
				referenceElectrode: 'SHE',
				ph: String(r.ph),
				temperatureK: '298',
				method: r.method,
				uncertaintyMv: '10'
			};
			if (r.corruption === 'repeat' && lastValid) {
				cells = { ...lastValid.cells };
				expected.push({
					row,
					column: 'reportedValue',
					message: new RegExp(`^repeats row ${lastValid.row}$`)
				});
			} else if (r.corruption !== null && r.corruption !== 'repeat') {
				const c = CORRUPTIONS[r.corruption]!;
				cells[c.column] = c.text;
				expected.push({ row, column: c.column, message: c.message });
			} else {
				lastValid = { row, cells };
				committed.push({ row, reportedValue: -200 - i });
			}
			lines.push(
				f.order.map((name) => q(r.pad ? ` ${cells[name]} ` : cells[name])).join(f.delimiter)
			);
		});
		return { text: (f.bom ? '\uFEFF' : '') + lines.join(f.eol), expected, committed };
	});

describe('well-formed CSV files with recorded corruptions', () => {
	it('report exactly the corrupted cells; clean files are committed, the others refused', async () => {
		let committedRuns = 0;
		let refusedRuns = 0;
		await fc.assert(
			fc.asyncProperty(goodFileArb, async ({ text, expected, committed }) => {
				const check = await checkUpload(db, text, 'potential', {
					viewer: null,
					limits: uploadCsvLimits
				});
				const errors = check.issues.filter((i) => i.severity === 'error');
				expect(errors.map((e) => [e.row, e.column])).toEqual(
					expected.map((e) => [e.row, e.column])
				);
				errors.forEach((e, k) => expect(e.message).toMatch(expected[k]!.message));
				expect(check.entries.map((e) => e.row)).toEqual(committed.map((c) => c.row));
				expect(
					check.entries.map((e) => (e.entry.data as { reportedValue: number }).reportedValue)
				).toEqual(committed.map((c) => c.reportedValue));

				const before = await counts();
				const outcome = await tryCommit(check);
				const after = await counts();
				if (expected.length === 0) {
					committedRuns++;
					expect(outcome).toMatchObject({ created: committed.length });
					expect(after - before).toBe(committed.length);
				} else {
					refusedRuns++;
					expect(outcome).toBeInstanceOf(UploadHasErrorsError);
					expect((outcome as UploadHasErrorsError).errorCount).toBe(expected.length);
					expect(after).toBe(before);
				}
			}),
			{ numRuns: 150 }
		);
		expect(committedRuns).toBeGreaterThan(10);
		expect(refusedRuns).toBeGreaterThan(10);
	});
});
