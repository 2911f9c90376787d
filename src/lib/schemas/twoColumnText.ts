import Papa from 'papaparse';
import { readDecimal } from './decimal';
import { separatorOf } from './columnSeparator';

/*
 * Two numeric columns from pasted or uploaded text (titration points, a sampled potential): an
 * optional header row; columns separated by tabs, semicolons, commas or spaces (the separator is
 * decided once for the text: columnSeparator.ts). Every number is read by `readDecimal` (the one
 * reader: Unicode minus, digit-group spaces, the decimal comma wherever commas do not separate
 * the columns; hexadecimal, "Infinity" and empty cells refused).
 *
 * Rows are numbered as the lines of the text (1 = the first line, a header counts, blank lines
 * count), so that a message points at the line the reader sees. A bad row gets one message
 * saying what was wrong and what was expected, and the listing is capped (listRowProblems), so
 * that a paste of the wrong thing gives a short list, not hundreds of lines. Only the first
 * `maxRows` + 1 lines that hold anything (a header may come first) are read, so an oversized
 * paste costs no more than a full one. Shared by the calculators' actions and their pages (the
 * "API:" line is built from the same reading).
 */

export interface RowProblem {
	/** Line number in the text, from 1. */
	row: number;
	message: string;
}

export interface TwoColumnRows {
	rows: [number, number][];
	/** The line number of each row in `rows`. */
	lines: number[];
	problems: RowProblem[];
	/** Set when the text has more rows than allowed. */
	tooMany: string | null;
}

/** What a number cell should hold, said in every message about one. */
export const EXPECTED_NUMBER = 'expected a decimal number such as −400 or 0,98';

/** How many bad rows a listing names before it says how many more there are. */
export const ROW_PROBLEMS_SHOWN = 20;

const isBlankLine = (line: string) => /^[\s,;]*$/.test(line);

export function parseTwoColumnText(
	text: string,
	columns: [string, string],
	maxRows: number
): TwoColumnRows {
	const body = text.replace(/^\uFEFF/, '');
	const kept: { line: number; text: string }[] = [];
	let tooMany: string | null = null;
	// Line by line, so that an oversized paste is read no further than one line past the limit.
	let start = 0;
	for (let line = 1; start <= body.length; line++) {
		const match = /\r\n|\n|\r/g;
		match.lastIndex = start;
		const found = match.exec(body);
		const end = found ? found.index : body.length;
		const content = body.slice(start, end);
		start = found ? end + found[0].length : body.length + 1;
		if (isBlankLine(content)) continue;
		if (kept.length === maxRows + 1) {
			tooMany = `at most ${maxRows} rows; the text has more`;
			break;
		}
		kept.push({ line, text: content });
	}
	const separator = separatorOf(kept.map((k) => k.text).join('\n'));
	const cellsOf = (line: string): string[] =>
		separator === ' '
			? line.trim().split(/\s+/)
			: (Papa.parse<string[]>(line, { delimiter: separator }).data[0] ?? []);
	const read = (cell: string | undefined) =>
		readDecimal(cell ?? '', { decimalComma: separator !== ',' });
	const out: TwoColumnRows = { rows: [], lines: [], problems: [], tooMany };
	kept.forEach(({ line, text: content }, i) => {
		const cells = cellsOf(content);
		const a = read(cells[0]);
		const b = read(cells[1]);
		if (i === 0 && a === null && b === null) return; // a header
		if (cells.length !== 2) {
			out.problems.push({
				row: line,
				message: `found ${cells.length} ${cells.length === 1 ? 'column' : 'columns'}; expected two (${columns.join(', ')})`
			});
			return;
		}
		const bad = [
			...(a === null ? [`${columns[0]} “${cells[0]}” is not a number`] : []),
			...(b === null ? [`${columns[1]} “${cells[1]}” is not a number`] : [])
		];
		if (bad.length) {
			out.problems.push({ row: line, message: `${bad.join(', ')}; ${EXPECTED_NUMBER}` });
			return;
		}
		out.rows.push([a!, b!]);
		out.lines.push(line);
	});
	if (!tooMany && out.rows.length > maxRows)
		out.tooMany = `at most ${maxRows} rows; the text has more`;
	return out;
}

/**
 * The problems as a reader's list: one line per row (a row's several problems joined), in row
 * order, the first ROW_PROBLEMS_SHOWN of them and then how many more rows there are.
 */
export function listRowProblems(
	problems: readonly RowProblem[],
	shown = ROW_PROBLEMS_SHOWN
): string[] {
	const byRow = new Map<number, string[]>();
	for (const p of [...problems].sort((x, y) => x.row - y.row))
		byRow.set(p.row, [...(byRow.get(p.row) ?? []), p.message]);
	const lines = [...byRow].map(([row, messages]) => `row ${row}: ${messages.join('; ')}`);
	if (lines.length <= shown) return lines;
	const more = lines.length - shown;
	return [
		...lines.slice(0, shown),
		`and ${more} more ${more === 1 ? 'row' : 'rows'} with problems`
	];
}
