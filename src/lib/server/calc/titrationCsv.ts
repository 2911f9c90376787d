import Papa from 'papaparse';
import { MAX_TITRATION_POINTS } from '$lib/schemas/calc';
import type { TitrationPoint } from '$lib/science';

/**
 * Titration points from pasted or uploaded text: two columns, potential (mV) and signal, with an
 * optional header row; comma, semicolon or tab separated (papaparse detects which); the unicode
 * minus and, with semicolons, the decimal comma are accepted. Every bad row is reported.
 */
export function parseTitrationText(text: string): { points: TitrationPoint[]; errors: string[] } {
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, '').trim(), {
		skipEmptyLines: 'greedy'
	});
	const decimalComma = parsed.meta.delimiter === ';';
	const toNumber = (cell: string | undefined) => {
		const cleaned = (cell ?? '').trim().replace(/\u2212/g, '-');
		return cleaned === '' ? Number.NaN : Number(decimalComma ? cleaned.replace(',', '.') : cleaned);
	};
	const points: TitrationPoint[] = [];
	const errors: string[] = [];
	parsed.data.forEach((row, i) => {
		const potentialMv = toNumber(row[0]);
		const signal = toNumber(row[1]);
		if (i === 0 && Number.isNaN(potentialMv) && Number.isNaN(signal)) return; // header
		if (row.length < 2)
			errors.push(
				`row ${i + 1}: expected two columns (potential in mV, signal), found ${row.length}`
			);
		else if (!Number.isFinite(potentialMv))
			errors.push(`row ${i + 1}, potential: "${row[0]}" is not a number`);
		else if (!Number.isFinite(signal))
			errors.push(`row ${i + 1}, signal: "${row[1]}" is not a number`);
		else points.push({ potentialMv, signal });
	});
	if (points.length > MAX_TITRATION_POINTS)
		errors.push(`at most ${MAX_TITRATION_POINTS} points; found ${points.length}`);
	return { points, errors };
}
