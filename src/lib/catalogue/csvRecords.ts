import Papa from 'papaparse';
import { DomainError } from '$lib/domainError';

/*
 * Cuts CSV text into blocks of whole records and enforces the shape limits of an upload while
 * doing so, before papaparse builds a single cell. Shared by the server's reader and the browser
 * preview, so that both refuse the same files with the same message.
 *
 * Why: papaparse builds a record's whole cell array before anyone can look at it, and re-parses
 * a record that spans its chunks from the start in every chunk. A 10 MB line of five million
 * empty columns therefore cost gigabytes and a minute of CPU; one unclosed quote made the rest
 * of a file a single cell. Here one pass over the characters counts cells, record length and
 * cell length, and stops at the first limit passed; only blocks that fit go to papaparse.
 *
 * The scanner follows papaparse's reading of quotes: a cell is quoted when it starts with `"`;
 * inside, `""` is a quote; a `"` closes the cell when it is followed (after any white space) by
 * the delimiter, the line break or the end of the text, and is kept as text otherwise.
 */
export interface CsvLimits {
	/** Rows after the header, blank rows included. */
	maxRows: number;
	/** Cells in one row (the header included). */
	maxColumns: number;
	/** Characters in one row (without its line break; a quoted cell's own line breaks count). */
	maxLineChars: number;
	/** Characters in one cell (with its quotes). */
	maxCellChars: number;
}

export type CsvLimitKind = 'rows' | 'columns' | 'line' | 'cell';

/**
 * A file beyond one of the limits; the message names the row and the limit, for people. Answered
 * 413 beside the file field (`fields.file`) on the page and in the API.
 */
export class CsvLimitError extends DomainError {
	constructor(
		readonly kind: CsvLimitKind,
		readonly limit: number,
		/** The row as a spreadsheet numbers it (the header is row 1). */
		readonly row: number,
		message: string
	) {
		super('payload_too_large', message, { fields: { file: [message] } });
		this.name = 'CsvLimitError';
	}
}

const count = (n: number) => n.toLocaleString('en');

function limitError(
	kind: CsvLimitKind,
	limits: CsvLimits,
	row: number,
	quoted = false
): CsvLimitError {
	switch (kind) {
		case 'rows':
			return new CsvLimitError(
				kind,
				limits.maxRows,
				row,
				`The file has more than ${count(limits.maxRows)} rows after the header (blank rows count too), the limit per file; split it.`
			);
		case 'columns':
			return new CsvLimitError(
				kind,
				limits.maxColumns,
				row,
				`Row ${count(row)} has more than ${count(limits.maxColumns)} columns, the limit per file; delete unused columns (spreadsheets sometimes export empty ones) and try again.`
			);
		case 'line':
			return new CsvLimitError(
				kind,
				limits.maxLineChars,
				row,
				`Row ${count(row)} is longer than ${count(limits.maxLineChars)} characters, the limit for one row.`
			);
		case 'cell':
			return new CsvLimitError(
				kind,
				limits.maxCellChars,
				row,
				`Row ${count(row)} has a cell longer than ${count(limits.maxCellChars)} characters, the limit for one cell.` +
					(quoted ? ' The cell starts with a quote: check that every quote is closed.' : '')
			);
	}
}

export interface CsvDialect {
	delimiter: string;
	newline: '\n' | '\r\n' | '\r';
}

/** Whole records of the text, in order. */
export interface CsvBlock {
	/** The records' text; every record but perhaps the file's last ends with its line break. */
	text: string;
	/** Row number of the first record, as a spreadsheet shows it (the header is row 1). */
	firstRow: number;
}

/** How many records the delimiter is guessed from (papaparse's guess, on a bounded prefix). */
const SNIFF_RECORDS = 10;
const DELIMITERS_TO_GUESS = [',', ';', '\t'];
const SPACE = /\s/;

/**
 * Feed text in pieces of any size (`push`), then call `end`; each call returns the whole records
 * seen so far that no earlier call returned, or null. Throws CsvLimitError at the first limit
 * passed. Holds at most one unfinished record (bounded by the limits) plus the last piece.
 */
export class CsvRecordSplitter {
	readonly #limits: CsvLimits;
	#buffer = '';
	#dialect: CsvDialect | null = null;
	#nextRow = 1;

	constructor(limits: CsvLimits) {
		this.#limits = limits;
	}

	/** The delimiter and line break, known once the first records (or the whole text) are in. */
	get dialect(): CsvDialect | null {
		return this.#dialect;
	}

	push(text: string): CsvBlock | null {
		this.#buffer += text;
		return this.#take(false);
	}

	end(): CsvBlock | null {
		const block = this.#take(true);
		this.#dialect ??= { delimiter: ',', newline: '\n' };
		return block;
	}

	#take(eof: boolean): CsvBlock | null {
		this.#dialect ??= sniffDialect(this.#buffer, eof, this.#limits);
		const dialect = this.#dialect;
		if (!dialect) return null;
		const buffer = this.#buffer;
		const firstRow = this.#nextRow;
		let at = 0;
		while (at < buffer.length) {
			if (this.#nextRow > this.#limits.maxRows + 1)
				throw limitError('rows', this.#limits, this.#nextRow);
			const end = scanRecord(buffer, at, eof, dialect, this.#limits, this.#nextRow);
			if (end === -1) break;
			at = end;
			this.#nextRow++;
		}
		if (at === 0) return null;
		this.#buffer = buffer.slice(at);
		return { text: buffer.slice(0, at), firstRow };
	}
}

function startsNewline(text: string, at: number, newline: string): boolean {
	return newline.length === 1 ? text[at] === newline : text.startsWith(newline, at);
}

/**
 * Finds the end of the record starting at `start` (the index after its line break, or the text's
 * length at the end of the file), or -1 when the text ends before the record does. Throws at the
 * first limit passed, without looking further.
 */
function scanRecord(
	text: string,
	start: number,
	eof: boolean,
	{ delimiter, newline }: CsvDialect,
	limits: CsvLimits,
	row: number
): number {
	const len = text.length;
	const delimiterCode = delimiter.charCodeAt(0);
	const newlineCode = newline.charCodeAt(0);
	const lineEnd = start + limits.maxLineChars;
	let cells = 1;
	let i = start;
	for (;;) {
		const cellStart = i;
		const cellEnd = cellStart + limits.maxCellChars;
		if (text.charCodeAt(i) === 0x22 /* " */) {
			// A quoted cell: look for the quote that closes it.
			let q = i;
			for (;;) {
				q = text.indexOf('"', q + 1);
				const reach = q === -1 ? len : q + 1;
				if (reach > cellEnd) throw limitError('cell', limits, row, true);
				if (reach > lineEnd) throw limitError('line', limits, row);
				if (q === -1) return eof ? len : -1; // unclosed so far; papaparse reports it at the end
				if (q + 1 === len) {
					if (!eof) return -1;
					i = len;
					break;
				}
				if (text.charCodeAt(q + 1) === 0x22) {
					q++; // an escaped quote
					continue;
				}
				// White space between a closing quote and the delimiter is dropped, as papaparse does.
				let k = q + 1;
				const spaceStop = Math.min(len, cellEnd + 1, lineEnd + 1);
				while (
					k < spaceStop &&
					text.charCodeAt(k) !== delimiterCode &&
					!startsNewline(text, k, newline) &&
					SPACE.test(text[k] as string)
				)
					k++;
				if (k - cellStart > limits.maxCellChars) throw limitError('cell', limits, row, true);
				if (k - start > limits.maxLineChars) throw limitError('line', limits, row);
				if (k === len && !eof) return -1;
				if (k === len || text.charCodeAt(k) === delimiterCode || startsNewline(text, k, newline)) {
					i = k;
					break;
				}
				// A quote inside the cell that does not close it: kept as text, as papaparse does.
			}
		} else {
			const stop = Math.min(len, cellEnd + 1, lineEnd + 1);
			while (i < stop) {
				const c = text.charCodeAt(i);
				if (c === delimiterCode) break;
				if (c === newlineCode) {
					if (newline.length === 1) break;
					if (i + 1 === len && !eof) return -1;
					if (text.charCodeAt(i + 1) === 0x0a) break;
				}
				i++;
			}
			if (i - cellStart > limits.maxCellChars) throw limitError('cell', limits, row);
			if (i - start > limits.maxLineChars) throw limitError('line', limits, row);
		}
		if (i >= len) return eof ? len : -1;
		if (text.charCodeAt(i) === delimiterCode) {
			if (++cells > limits.maxColumns) throw limitError('columns', limits, row);
			i += delimiter.length;
			continue;
		}
		return i + newline.length; // at the line break
	}
}

/**
 * The line break (the first one outside quotes) and the delimiter (papaparse's guess from the
 * first records only), or null while the text seen so far is too short to tell.
 */
function sniffDialect(text: string, eof: boolean, limits: CsvLimits): CsvDialect | null {
	let newline: CsvDialect['newline'] | null = null;
	let inQuotes = false;
	let records = 0;
	let recordStart = 0;
	let prefixEnd = -1;
	// Candidate delimiters outside quotes in the current record: a row too long to guess from
	// is reported as too wide when one of them alone passes the column limit.
	const seen = new Map(DELIMITERS_TO_GUESS.map((d) => [d, 0]));
	for (let i = 0; i < text.length; i++) {
		if (i - recordStart > limits.maxLineChars) {
			const row = records + 1;
			if (inQuotes) throw limitError('cell', limits, row, true);
			if (Math.max(...seen.values()) >= limits.maxColumns) throw limitError('columns', limits, row);
			throw limitError('line', limits, row);
		}
		const c = text[i] as string;
		if (c === '"') inQuotes = !inQuotes;
		else if (inQuotes) continue;
		else if (seen.has(c)) seen.set(c, (seen.get(c) as number) + 1);
		else if (c === '\n' || c === '\r') {
			if (newline === null) {
				if (c === '\n') newline = '\n';
				else if (i + 1 < text.length) newline = text[i + 1] === '\n' ? '\r\n' : '\r';
				else if (eof) newline = '\r';
				else return null;
			}
			if (!startsNewline(text, i, newline)) continue;
			if (++records === SNIFF_RECORDS) {
				prefixEnd = i;
				break;
			}
			i += newline.length - 1;
			recordStart = i + 1;
			for (const d of DELIMITERS_TO_GUESS) seen.set(d, 0);
		}
	}
	newline ??= '\n';
	if (prefixEnd === -1) {
		if (!eof) return null;
		prefixEnd = text.endsWith(newline) ? text.length - newline.length : text.length;
	}
	// Without the last line break: papaparse would count the empty record after it.
	const guess = Papa.parse<string[]>(text.slice(0, prefixEnd), {
		delimitersToGuess: DELIMITERS_TO_GUESS,
		newline,
		preview: SNIFF_RECORDS
	});
	return { delimiter: guess.meta.delimiter || ',', newline };
}

/** One block's records (row numbers as a spreadsheet shows them) and papaparse's complaints. */
export function parseBlock(
	block: CsvBlock,
	dialect: CsvDialect
): { records: { row: number; cells: string[] }[]; problems: { row: number; message: string }[] } {
	const parsed = Papa.parse<string[]>(block.text, {
		delimiter: dialect.delimiter,
		newline: dialect.newline,
		skipEmptyLines: false
	});
	// A block ending in a line break makes papaparse add an empty record after it.
	const last = parsed.data.at(-1);
	if (block.text.endsWith(dialect.newline) && last?.length === 1 && last[0] === '')
		parsed.data.pop();
	return {
		records: parsed.data.map((cells, k) => ({ row: block.firstRow + k, cells })),
		problems: parsed.errors.map((e) => ({ row: block.firstRow + (e.row ?? 0), message: e.message }))
	};
}
