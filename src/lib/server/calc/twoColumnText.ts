import Papa from 'papaparse';

/**
 * Two numeric columns from pasted or uploaded text (titration points, a sampled potential): an
 * optional header row; comma, semicolon or tab separated (papaparse detects which); a BOM, the
 * unicode minus and, with semicolons, the decimal comma are accepted. Every bad row is reported
 * with its number and the name of the column. Reading stops one row past `maxRows` (plus a
 * header), so an oversized paste costs no more than a full one.
 */
export function parseTwoColumnText(
	text: string,
	columns: [string, string],
	maxRows: number
): { rows: [number, number][]; errors: string[] } {
	const data: string[][] = [];
	let delimiter = ',';
	Papa.parse<string[]>(text.replace(/^\uFEFF/, '').trim(), {
		skipEmptyLines: 'greedy',
		step: (result, parser) => {
			data.push(result.data);
			delimiter = result.meta.delimiter;
			if (data.length > maxRows + 1) parser.abort(); // one past the limit, after a header
		}
	});
	const decimalComma = delimiter === ';';
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
	if (data.length - (header ? 1 : 0) > maxRows)
		errors.push(`at most ${maxRows} rows; the text has more`);
	return { rows, errors };
}
