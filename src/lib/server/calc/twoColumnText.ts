import Papa from 'papaparse';
import { readDecimal } from '$lib/schemas/decimal';
import { separatorOf } from '$lib/schemas/columnSeparator';

/**
 * Two numeric columns from pasted or uploaded text (titration points, a sampled potential): an
 * optional header row; columns separated by tabs, semicolons, commas or spaces. Every number is
 * read by `readDecimal` (the one reader: Unicode minus, digit-group spaces, the decimal comma
 * wherever commas do not separate the columns; hexadecimal, "Infinity" and empty cells refused).
 * Every bad row is reported with its number and the name of the column, one message per row. Only
 * the first `maxRows` + 1 lines that hold anything (a header may come first) are parsed, so an
 * oversized paste costs no more than a full one.
 *
 * The separator is decided once for the text: a tab if any line has one, else a semicolon if any
 * line has one, else spaces when every line is words separated by spaces with no comma beside a
 * space ("−400 0,98", "-400 0.98"), else a comma ("-400,0.98", "-400, 0.98"; quotes as in CSV).
 */
export function parseTwoColumnText(
	text: string,
	columns: [string, string],
	maxRows: number
): { rows: [number, number][]; errors: string[] } {
	const { head, more } = leadingLines(text.replace(/^\uFEFF/, '').trim(), maxRows + 1);
	const separator = separatorOf(head);
	const data =
		separator === ' '
			? head
					.split(/\r?\n|\r/)
					.map((line) => line.trim())
					.filter((line) => line !== '')
					.map((line) => line.split(/\s+/))
			: Papa.parse<string[]>(head, { delimiter: separator, skipEmptyLines: 'greedy' }).data;
	const read = (cell: string | undefined) =>
		readDecimal(cell ?? '', { decimalComma: separator !== ',' });
	const rows: [number, number][] = [];
	const errors: string[] = [];
	let header = false;
	data.forEach((row, i) => {
		const a = read(row[0]);
		const b = read(row[1]);
		if (i === 0 && a === null && b === null) {
			header = true;
			return;
		}
		if (row.length < 2)
			errors.push(
				`row ${i + 1}: expected two columns (${columns.join(', ')}), found ${row.length}`
			);
		else if (a === null) errors.push(`row ${i + 1}, ${columns[0]}: "${row[0]}" is not a number`);
		else if (b === null) errors.push(`row ${i + 1}, ${columns[1]}: "${row[1]}" is not a number`);
		else rows.push([a, b]);
	});
	if (more || data.length - (header ? 1 : 0) > maxRows)
		errors.push(`at most ${maxRows} rows; the text has more`);
	return { rows, errors };
}

/** The text up to its first `count` lines with content, and whether any content follows. */
function leadingLines(text: string, count: number): { head: string; more: boolean } {
	let seen = 0;
	let start = 0;
	while (start < text.length) {
		const newline = text.indexOf('\n', start);
		const end = newline === -1 ? text.length : newline;
		// Lines of only spaces and separators are skipped by the parser too.
		if (!/^[\s,;]*$/.test(text.slice(start, end)) && ++seen > count) {
			return { head: text.slice(0, start), more: true };
		}
		start = end + 1;
	}
	return { head: text, more: false };
}
