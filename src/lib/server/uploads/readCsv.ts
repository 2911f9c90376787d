import {
	CsvRecordSplitter,
	parseBlock,
	type CsvBlock,
	type CsvLimits
} from '$lib/catalogue/csvRecords';
import { config } from '../config';
import { setImmediate } from 'node:timers/promises';

/*
 * Reads CSV text as people export it from spreadsheets: comma, semicolon or tab; UTF-8 with or
 * without a byte-order mark; Windows or Unix line ends; quoted fields; blank rows anywhere. The
 * text goes through the record splitter in chunks that yield to the event loop, so a large file
 * never stalls the server, and a file beyond the limits (rows, columns, length of a row or a
 * cell) is refused with CsvLimitError before papaparse builds anything for it.
 */
export interface CsvTable {
	delimiter: string;
	headers: string[];
	/** Data records with their row number as a spreadsheet shows it (the header is row 1). */
	rows: { row: number; cells: string[] }[];
	/** Problems of the file as a whole (unclosed quotes and the like), by row. */
	problems: { row: number; message: string }[];
}

/** The limits of an upload, from the configuration. */
export const uploadCsvLimits: CsvLimits = {
	maxRows: config.UPLOAD_MAX_ROWS,
	maxColumns: config.UPLOAD_MAX_COLUMNS,
	maxLineChars: config.UPLOAD_MAX_LINE_CHARS,
	maxCellChars: config.UPLOAD_MAX_CELL_CHARS
};

const CHUNK_CHARS = 512 * 1024;

export async function readCsv(text: string, limits: CsvLimits): Promise<CsvTable> {
	const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	const table: CsvTable = { delimiter: ',', headers: [], rows: [], problems: [] };
	const splitter = new CsvRecordSplitter(limits);
	const take = (block: CsvBlock | null) => {
		if (!block || !splitter.dialect) return;
		const { records, problems } = parseBlock(block, splitter.dialect);
		table.problems.push(...problems);
		for (const { row, cells } of records) {
			if (row === 1) table.headers = cells.map((h) => h.trim());
			else if (cells.some((c) => c.trim() !== '')) table.rows.push({ row, cells });
		}
	};
	for (let at = 0; at < source.length; at += CHUNK_CHARS) {
		take(splitter.push(source.slice(at, at + CHUNK_CHARS)));
		await setImmediate();
	}
	take(splitter.end());
	table.delimiter = splitter.dialect?.delimiter ?? ',';
	return table;
}
