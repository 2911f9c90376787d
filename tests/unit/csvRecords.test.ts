import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
	CsvLimitError,
	CsvRecordSplitter,
	parseBlock,
	type CsvLimits
} from '$lib/catalogue/csvRecords';
import { readCsv, uploadCsvLimits } from '$lib/server/uploads/readCsv';

// The record splitter enforces the upload's shape limits before papaparse builds any cells, and
// must otherwise read files exactly as papaparse reads them whole (papaparse is the oracle).
const LIMITS: CsvLimits = {
	maxRows: 200_000,
	maxColumns: 200,
	maxLineChars: 65_536,
	maxCellChars: 10_000
};

/** Splits `text` in pieces of the given sizes (cycled) and collects records, or the error. */
function split(text: string, sizes: number[], limits = LIMITS) {
	const splitter = new CsvRecordSplitter(limits);
	const records: { row: number; cells: string[] }[] = [];
	const take = (block: ReturnType<CsvRecordSplitter['push']>) => {
		if (block && splitter.dialect) records.push(...parseBlock(block, splitter.dialect).records);
	};
	try {
		for (let at = 0, k = 0; at < text.length; k++) {
			const size = sizes[k % sizes.length] as number;
			take(splitter.push(text.slice(at, at + size)));
			at += size;
		}
		take(splitter.end());
		return { records, dialect: splitter.dialect, error: null };
	} catch (e) {
		if (!(e instanceof CsvLimitError)) throw e;
		return {
			records: null,
			dialect: null,
			error: { kind: e.kind, row: e.row, message: e.message }
		};
	}
}

/** The refusal of a text read in 512 KB pieces, as the server reads it. */
function refusal(text: string, limits = LIMITS) {
	const { error } = split(text, [512 * 1024], limits);
	if (!error) throw new Error('the text was not refused');
	return error;
}

const cell = fc.string({
	unit: fc.constantFrom('a', 'b', '1', ' ', ',', ';', '\t', '"', '\n', '\r', 'é', '–'),
	maxLength: 8
});
const table = fc.array(fc.array(cell, { minLength: 2, maxLength: 5 }), {
	minLength: 1,
	maxLength: 25
});

describe('CsvRecordSplitter reads what papaparse reads', () => {
	it('gives papaparse’s records for well-formed files, however the text is cut', () => {
		fc.assert(
			fc.property(
				table,
				fc.constantFrom(',', ';', '\t'),
				fc.constantFrom('\n', '\r\n'),
				fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 5 }),
				(rows, delimiter, newline, sizes) => {
					// Same width in every row, as a spreadsheet exports.
					const width = Math.max(...rows.map((r) => r.length));
					const full = rows.map((r) => [...r, ...Array(width - r.length).fill('x')]);
					const text = Papa.unparse(full, { delimiter, newline });
					const whole = split(text, [text.length]);
					const cut = split(text, sizes);
					expect(cut).toEqual(whole);
					const dialect = whole.dialect!;
					// The oracle: papaparse on the whole text with the same delimiter and line break.
					const oracle = Papa.parse<string[]>(text, { ...dialect, skipEmptyLines: false }).data;
					expect(whole.records!.map((r) => r.cells)).toEqual(oracle);
					expect(dialect.newline).toBe(full.length > 1 ? newline : dialect.newline);
					if (dialect.delimiter === delimiter) expect(oracle).toEqual(full);
				}
			),
			{ numRuns: 300 }
		);
	});

	it('reads malformed text the same however it is cut, numbering rows from 1', () => {
		fc.assert(
			fc.property(
				fc.string({
					unit: fc.constantFrom('a', ',', ';', '"', '"', ' ', '\n', '\r', '\t'),
					maxLength: 120
				}),
				fc.array(fc.integer({ min: 1, max: 30 }), { minLength: 1, maxLength: 4 }),
				(text, sizes) => {
					const small = { maxRows: 12, maxColumns: 6, maxLineChars: 40, maxCellChars: 15 };
					const whole = split(text, [text.length || 1], small);
					expect(split(text, sizes, small)).toEqual(whole);
					if (whole.records) {
						whole.records.forEach((r, k) => expect(r.row).toBe(k + 1));
						for (const r of whole.records) expect(r.cells.length).toBeLessThanOrEqual(40);
					}
				}
			),
			{ numRuns: 500 }
		);
	});

	it('keeps quoted line breaks, escaped quotes and Windows line ends inside cells', () => {
		const text = 'name,note\r\n"A, B","two\r\nlines"\r\n"say ""hi""",plain\r\n';
		const { records, dialect } = split(text, [3, 7]);
		expect(dialect).toEqual({ delimiter: ',', newline: '\r\n' });
		expect(records!.map((r) => r.cells)).toEqual([
			['name', 'note'],
			['A, B', 'two\r\nlines'],
			['say "hi"', 'plain']
		]);
		expect(records!.map((r) => r.row)).toEqual([1, 2, 3]);
	});

	it('guesses the semicolon and the tab from the first rows', () => {
		expect(split('a;b\n1,5;2\n', [4]).dialect?.delimiter).toBe(';');
		expect(split('a\tb\n1\t2\n', [2]).dialect?.delimiter).toBe('\t');
	});
});

describe('CsvRecordSplitter refuses files beyond the limits, naming the row', () => {
	it('refuses 5 million empty columns (10 MB) at row 1, from the first piece', () => {
		const splitter = new CsvRecordSplitter(LIMITS);
		const wide = ','.repeat(5_000_000) + '\n';
		let error: unknown = null;
		try {
			splitter.push(wide.slice(0, 512 * 1024));
		} catch (e) {
			error = e;
		}
		expect(error).toBeInstanceOf(CsvLimitError);
		expect((error as CsvLimitError).kind).toBe('columns');
		expect((error as CsvLimitError).row).toBe(1);
		expect((error as CsvLimitError).message).toBe(
			'Row 1 has more than 200 columns, the limit per file; delete unused columns (spreadsheets sometimes export empty ones) and try again.'
		);
		expect(refusal(wide).kind).toBe('columns');
	});

	it('refuses a data row wider than the limit with its own row number', () => {
		const header = Array.from({ length: 10 }, (_, i) => `c${i}`).join(',');
		const rows = ['1,2', '', 'x' + ','.repeat(200)];
		const e = refusal([header, ...rows].join('\n'));
		expect([e.kind, e.row]).toEqual(['columns', 4]);
	});

	it('accepts exactly the limit of columns', () => {
		const text = Array(200).fill('h').join(',') + '\n' + Array(200).fill('1').join(',');
		expect(split(text, [100]).records![1]!.cells).toHaveLength(200);
	});

	it('refuses a single huge quoted cell (an unclosed quote), saying so', () => {
		const e = refusal('centreAccession,note\nHL000001,"' + 'x'.repeat(2_000_000));
		expect([e.kind, e.row]).toEqual(['cell', 2]);
		expect(e.message).toContain('check that every quote is closed');
	});

	it('refuses an unclosed quote in the header before guessing the delimiter', () => {
		const e = refusal('"a,b\n' + 'row,1\n'.repeat(20_000));
		expect([e.kind, e.row]).toEqual(['cell', 1]);
	});

	it('refuses a huge header cell and a long row', () => {
		expect(refusal('h'.repeat(20_000) + ',b\n1,2\n').kind).toBe('cell');
		const long = Array(100).fill('y'.repeat(1000)).join(',');
		const e = refusal(`a,b\n1,2\n${long}\n`);
		expect([e.kind, e.row, e.message]).toEqual([
			'line',
			3,
			'Row 3 is longer than 65,536 characters, the limit for one row.'
		]);
	});

	it('counts blank rows towards the row limit (millions of rows of one comma each)', () => {
		const e = refusal('a,b\n' + ',\n'.repeat(3_000_000));
		expect([e.kind, e.row]).toEqual(['rows', 200_002]);
		// Exactly the limit passes, and a final line break is not a row.
		const limits = { ...LIMITS, maxRows: 3 };
		expect(split('a\n1\n\n2\n', [2], limits).error).toBeNull();
		expect(split('a\n1\n\n2\n3', [2], limits).error?.row).toBe(5);
	});
});

describe('readCsv', () => {
	it('reads through the splitter: header, data rows by row number, blank rows skipped', async () => {
		const table = await readCsv('\uFEFFa;b\r\n1,5;2\r\n;\r\n3;"4\r\n5"\r\n', uploadCsvLimits);
		expect(table.delimiter).toBe(';');
		expect(table.headers).toEqual(['a', 'b']);
		expect(table.rows).toEqual([
			{ row: 2, cells: ['1,5', '2'] },
			{ row: 4, cells: ['3', '4\r\n5'] }
		]);
		expect(table.problems).toEqual([]);
	});
	it('reports an unclosed quote by its row', async () => {
		const table = await readCsv('a,b\n1,2\n3,"4\n', uploadCsvLimits);
		expect(table.problems.map((p) => p.row)).toEqual([3]);
	});
	it('refuses the 10 MB file of empty columns with the configured limit', async () => {
		await expect(readCsv(','.repeat(5_000_000), uploadCsvLimits)).rejects.toMatchObject({
			kind: 'columns',
			row: 1,
			limit: uploadCsvLimits.maxColumns
		});
	});
});
