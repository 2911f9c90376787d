import Papa, { type ParseResult, type Parser } from 'papaparse';

/**
 * Reads CSV text as people export it from spreadsheets: comma, semicolon or tab; UTF-8 with or
 * without a byte-order mark; Windows or Unix line ends; quoted fields; blank rows anywhere. The
 * text is parsed in chunks that yield to the event loop, so a large file never stalls the server.
 */
export interface CsvTable {
	delimiter: string;
	headers: string[];
	/** Data records with their row number as a spreadsheet shows it (the header is row 1). */
	rows: { row: number; cells: string[] }[];
	/** Problems of the file as a whole (unclosed quotes and the like), by row. */
	problems: { row: number; message: string }[];
}

export class CsvTooLargeError extends Error {
	constructor(readonly limit: number) {
		super(`the file has more than ${limit} data rows`);
		this.name = 'CsvTooLargeError';
	}
}

const CHUNK_BYTES = 512 * 1024;

export function readCsv(text: string, options: { maxRows: number }): Promise<CsvTable> {
	const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	const table: CsvTable = { delimiter: ',', headers: [], rows: [], problems: [] };
	let record = 0;
	let tooMany = false;
	return new Promise((resolve, reject) => {
		Papa.parse<string[]>(source, {
			delimitersToGuess: [',', ';', '\t'],
			skipEmptyLines: false,
			chunkSize: CHUNK_BYTES,
			chunk: (results: ParseResult<string[]>, parser: Parser) => {
				table.delimiter = results.meta.delimiter;
				for (const e of results.errors) {
					// Papa's row index counts records from 0 within the whole file.
					if (e.code !== 'UndetectableDelimiter')
						table.problems.push({ row: (e.row ?? 0) + record + 1, message: e.message });
				}
				for (const cells of results.data as string[][]) {
					record++;
					if (record === 1) {
						table.headers = cells.map((h) => h.trim());
						continue;
					}
					if (cells.every((c) => c.trim() === '')) continue;
					if (table.rows.length >= options.maxRows) {
						// abort() completes the parse at once; complete() then reports the limit.
						tooMany = true;
						parser.abort();
						return;
					}
					table.rows.push({ row: record, cells });
				}
				parser.pause();
				setImmediate(() => parser.resume());
			},
			complete: () => (tooMany ? reject(new CsvTooLargeError(options.maxRows)) : resolve(table)),
			error: (e: Error) => reject(e)
		});
	});
}
