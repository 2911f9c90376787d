import { FIELD_UNITS, type FieldUnit } from '$lib/science/spectra';
import { POTENTIAL_UNITS, type PotentialUnit } from '$lib/science/units';
import { separatorOf } from './columnSeparator';
import { listRowProblems, parseTwoColumnText } from './twoColumnText';

/*
 * The numbers of a spectrum attached beside its image: two columns x, y (field and signal of an
 * EPR spectrum, potential and current of a voltammogram, wavelength and absorbance …), with an
 * optional header row naming each column and its unit.
 *
 * The rows are read by the calculators' reader (twoColumnText.ts: one separator for the whole
 * text, decimal commas, Unicode minus, rows numbered as lines, a capped listing of bad rows), so
 * a spectrum file and a pasted titration are read the same way. This module adds what a spectrum
 * needs on top: the header's names and units, the limits on size and points, and — when the
 * caller knows what the x axis must be (a field for EPR, a potential for a voltammogram) — a unit
 * the plot can convert, since a g axis or an SHE axis drawn from a guessed unit would be wrong
 * without looking wrong.
 *
 * Header cells are read as "name (unit)", "name [unit]" or "name / unit" (the quantity-calculus
 * form, "B / mT"); a cell with none of these is a name without a unit.
 */

/** Largest data file read, in bytes: 20 000 points of two 20-character numbers fit well. */
export const SPECTRUM_MAX_BYTES = 1_000_000;
/** Most points read; a spectrometer's sweep is a few thousand. */
export const SPECTRUM_MAX_POINTS = 20_000;
/** Fewest points that make a plot. */
export const SPECTRUM_MIN_POINTS = 2;
/** Longest column name or unit kept from a header (longer ones are refused, not cut). */
export const SPECTRUM_MAX_HEADER_CHARS = 60;

export interface SpectrumColumn {
	/** The column's name as written, e.g. "Field"; "x" or "y" when the text has no header. */
	name: string;
	/** The unit as written, e.g. "mT", "a.u."; null when the header gives none. */
	unit: string | null;
}

export interface SpectrumData {
	x: SpectrumColumn;
	y: SpectrumColumn;
	/** The points in file order (a cyclic voltammogram goes out and back, so no sorting). */
	points: [number, number][];
}

export type SpectrumReading = { ok: true; data: SpectrumData } | { ok: false; problems: string[] };

/** What the x axis must be: a magnetic field (EPR), a potential (voltammogram), or anything. */
export type SpectrumAxis = 'field' | 'potential' | 'any';

export interface SpectrumReadOptions {
	/** @default 'any' */
	xAxis?: SpectrumAxis;
}

/** The field unit a header unit names (gauss spelt out too), or null. */
export function fieldUnitOf(unit: string | null): FieldUnit | null {
	if (unit === null) return null;
	const u = unit.trim();
	if (/^gauss$/i.test(u)) return 'G';
	return (FIELD_UNITS as readonly string[]).includes(u) ? (u as FieldUnit) : null;
}

/** The potential unit a header unit names, or null. */
export function potentialUnitOf(unit: string | null): PotentialUnit | null {
	if (unit === null) return null;
	const u = unit.trim();
	return (POTENTIAL_UNITS as readonly string[]).includes(u) ? (u as PotentialUnit) : null;
}

/** "Field (mT)", "Field [mT]", "B / mT" → name and unit; anything else → a name alone. */
export function readColumnHeader(cell: string): SpectrumColumn {
	const text = cell
		.trim()
		.replace(/^"(.*)"$/, '$1')
		.trim();
	const [, name, unit] = /^(.*?)\s*[([]\s*([^()[\]]*?)\s*[)\]]$/.exec(text) ?? [];
	if (name) return { name, unit: unit || null };
	const [, slashName, slashUnit] = /^(.+?)\s+\/\s+(\S.*)$/.exec(text) ?? [];
	if (slashName && slashUnit) return { name: slashName, unit: slashUnit };
	return { name: text, unit: null };
}

/** The header line split into its two cells, or null when it cannot be split into two. */
function headerCells(line: string, text: string): [string, string] | null {
	const separator = separatorOf(text);
	const pair = (cells: readonly (string | undefined)[]): [string, string] | null => {
		const [a, b] = cells;
		return cells.length === 2 && a !== undefined && b !== undefined ? [a, b] : null;
	};
	// Quotes are allowed around a cell; a separator inside quotes is rare in a header.
	if (separator !== ' ') return pair(line.split(separator));
	const words = line.trim().split(/\s+/);
	if (words.length === 2) return pair(words);
	// "Field (mT) Intensity (a.u.)": the first cell ends at its unit's closing bracket.
	const split = /^(.*?[)\]])\s+(\S.*)$/.exec(line.trim());
	return split ? pair(split.slice(1)) : null;
}

const UNIT_EXAMPLE: Record<Exclude<SpectrumAxis, 'any'>, string> = {
	field: `a field in ${FIELD_UNITS.join(', ')} (e.g. a header "Field (mT)")`,
	potential: `a potential in ${POTENTIAL_UNITS.join(' or ')} (e.g. a header "Potential (V)")`
};

/**
 * Reads the numbers of a spectrum from the text (or bytes, which must be UTF-8) of a data file.
 * Every problem found is listed, rows with their line numbers, so that one round trip shows them
 * all; nothing is half-read: either all points are returned or none.
 */
export function readSpectrumData(
	input: string | Uint8Array,
	options: SpectrumReadOptions = {}
): SpectrumReading {
	const xAxis = options.xAxis ?? 'any';
	const size = typeof input === 'string' ? input.length : input.byteLength;
	// Checked before decoding or reading a line: an oversized file costs nothing more.
	if (size > SPECTRUM_MAX_BYTES) {
		return { ok: false, problems: [`the file is larger than ${SPECTRUM_MAX_BYTES} bytes`] };
	}
	let text: string;
	if (typeof input === 'string') text = input;
	else {
		try {
			text = new TextDecoder('utf-8', { fatal: true }).decode(input);
		} catch {
			return { ok: false, problems: ['the file is not UTF-8 text; expected two columns, x and y'] };
		}
	}
	if (text.includes('\0')) {
		return { ok: false, problems: ['the file is not text; expected two columns, x and y'] };
	}
	text = text.replace(/^\uFEFF/, '');

	const parsed = parseTwoColumnText(text, ['x', 'y'], SPECTRUM_MAX_POINTS);
	const problems: string[] = [];
	if (parsed.tooMany) problems.push(parsed.tooMany.replace('rows', 'points'));

	// The header, if any: the first line holding anything, when the reader skipped it as one.
	const lines = text.split(/\r\n|\n|\r/);
	const firstIndex = lines.findIndex((l) => !/^[\s,;]*$/.test(l));
	const firstLine = firstIndex + 1;
	const skippedAsHeader =
		firstIndex >= 0 &&
		!parsed.lines.includes(firstLine) &&
		!parsed.problems.some((p) => p.row === firstLine);
	let x: SpectrumColumn = { name: 'x', unit: null };
	let y: SpectrumColumn = { name: 'y', unit: null };
	if (skippedAsHeader) {
		const cells = headerCells(lines[firstIndex] ?? '', text);
		if (cells === null) {
			problems.push(
				`row ${firstLine}: the header does not name two columns; expected e.g. “Field (mT), Intensity (a.u.)”`
			);
		} else {
			[x, y] = cells.map(readColumnHeader) as [SpectrumColumn, SpectrumColumn];
			for (const [label, column] of [
				['x', x],
				['y', y]
			] as const) {
				if (
					column.name.length > SPECTRUM_MAX_HEADER_CHARS ||
					(column.unit?.length ?? 0) > SPECTRUM_MAX_HEADER_CHARS
				)
					problems.push(
						`row ${firstLine}: the ${label} column's name or unit is longer than ${SPECTRUM_MAX_HEADER_CHARS} characters`
					);
			}
		}
	}

	if (xAxis !== 'any') {
		const known = xAxis === 'field' ? fieldUnitOf(x.unit) : potentialUnitOf(x.unit);
		if (known === null) {
			problems.push(
				x.unit === null
					? `the x column must say its unit: expected ${UNIT_EXAMPLE[xAxis]}`
					: `the x column's unit “${x.unit}” is not one the plot can convert; expected ${UNIT_EXAMPLE[xAxis]}`
			);
		}
	}

	problems.push(...listRowProblems(parsed.problems));
	if (parsed.problems.length === 0 && parsed.rows.length < SPECTRUM_MIN_POINTS) {
		problems.push(
			`at least ${SPECTRUM_MIN_POINTS} points are needed; the file has ${parsed.rows.length}`
		);
	}
	if (
		parsed.rows.length >= SPECTRUM_MIN_POINTS &&
		parsed.rows.every(([px]) => px === parsed.rows[0]?.[0])
	) {
		problems.push('every x value is the same; expected x to change from row to row');
	}
	if (problems.length > 0) return { ok: false, problems };
	return { ok: true, data: { x, y, points: parsed.rows } };
}
