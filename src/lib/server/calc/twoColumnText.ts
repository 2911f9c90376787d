import Papa from 'papaparse';

/**
 * Two numeric columns from pasted or uploaded text (titration points, a sampled potential): an
 * optional header row; comma, semicolon or tab separated (papaparse detects which); a BOM, the
 * unicode minus and, with semicolons, the decimal comma are accepted. Every bad row is reported
 * with its number and the name of the column.
 */
export function parseTwoColumnText(
	text: string,
	columns: [string, string],
	maxRows: number
): { rows: [number, number][]; errors: string[] } {
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, '').trim(), {
		skipEmptyLines: 'greedy'
	});
	const decimalComma = parsed.meta.delimiter === ';';
	const toNumber = (cell: string | undefined) => {
		const cleaned = (cell ?? '').trim().replace(/\u2212/g, '-');
		return cleaned === '' ? Number.NaN : Number(decimalComma ? cleaned.replace(',', '.') : cleaned);
	};
	const rows: [number, number][] = [];
	const errors: string[] = [];
	parsed.data.forEach((row, i) => {
		const a = toNumber(row[0]);
		const b = toNumber(row[1]);
		if (i === 0 && Number.isNaN(a) && Number.isNaN(b)) return; // header
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
	if (rows.length > maxRows) errors.push(`at most ${maxRows} rows; found ${rows.length}`);
	return { rows, errors };
}
