import Papa from 'papaparse';

/**
 * Two numeric columns from pasted or uploaded text (titration points, a sampled potential): an
 * optional header row; comma, semicolon or tab separated (papaparse detects which); a BOM, the
 * unicode minus and, with semicolons, the decimal comma are accepted. Every bad row is reported
 * with its number and the name of the column. Only the first `maxRows` + 1 lines that hold
 * anything (a header may come first) are parsed, so an oversized paste costs no more than a full
 * one.
 */
export function parseTwoColumnText(
	text: string,
	columns: [string, string],
	maxRows: number
): { rows: [number, number][]; errors: string[] } {
	const { head, more } = leadingLines(text.replace(/^\uFEFF/, '').trim(), maxRows + 1);
	const parsed = Papa.parse<string[]>(head, { skipEmptyLines: 'greedy' });
	const data = parsed.data;
	const decimalComma = parsed.meta.delimiter === ';';
	const toNumber = (cell: string | undefined) => {
		const cleaned = (cell ?? '').trim().replace(/\u2212/g, '-');
		return cleaned === '' ? Number.NaN : Number(decimalComma ? cleaned.replace(',', '.') : cleaned);
	};
	const rows: [number, number][] = [];
	const errors: string[] = [];
	let header = false;
	data.forEach((row, i) => {
		const a = toNumber(row[0]);
		const b = toNumber(row[1]);
		if (i === 0 && Number.isNaN(a) && Number.isNaN(b)) {
			header = true;
			return;
		}
		if (row.length < 2)
			errors.push(
				`row ${i + 1}: expected two columns (${columns.join(', ')}), found ${row.length}`
			);
		else if (!Number.isFinite(a))
			errors.push(`row ${i + 1}, ${columns[0]}: "${row[0]}" is not a number`);
		else if (!Number.isFinite(b))
			errors.push(`row ${i + 1}, ${columns[1]}: "${row[1]}" is not a number`);
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
