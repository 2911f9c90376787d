import { MAX_POTENTIAL_SAMPLES } from '$lib/schemas/calc';
import { separatorOf, type Separator } from '$lib/schemas/columnSeparator';
import { NOT_A_DECIMAL, readDecimal } from '$lib/schemas/decimal';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { parseTwoColumnText, type RowProblem } from '$lib/schemas/twoColumnText';
import { ENERGY_UNIT_LABELS, convertEnergy, type EnergyUnit } from '$lib/science/units';
import { formatSignificant } from '$lib/format';

/*
 * The tunnelling form's fields, shared by the page and its action: names, defaults, the energy
 * unit every energy on the page is read and shown in, and number formatting in that unit.
 */

/** The units the page offers; every energy entered and shown is in the one chosen. */
export const PAGE_ENERGY_UNITS = ['kcal/mol', 'kJ/mol', 'cm-1'] as const satisfies EnergyUnit[];
export type PageEnergyUnit = (typeof PAGE_ENERGY_UNITS)[number];

export const isPageEnergyUnit = (u: string): u is PageEnergyUnit =>
	(PAGE_ENERGY_UNITS as readonly string[]).includes(u);

export const FIELD_NAMES = [
	'energyUnit',
	'temperatureK',
	'imagFreqCm1',
	'barrier',
	'potentialKind',
	'wellBarrier',
	'halfSeparationA',
	'asymmetry',
	'pointsText',
	'isotope',
	'levels',
	'xMinA',
	'xMaxA',
	'points'
] as const;
export type FieldName = (typeof FIELD_NAMES)[number];
export type FormValues = Record<FieldName, string>;

export const DEFAULTS: FormValues = {
	energyUnit: 'kcal/mol',
	temperatureK: '298.15',
	imagFreqCm1: '1200',
	barrier: '',
	potentialKind: 'double-well',
	wellBarrier: '6',
	halfSeparationA: '0.35',
	asymmetry: '0',
	pointsText: '',
	isotope: 'H',
	levels: '6',
	xMinA: '',
	xMaxA: '',
	points: ''
};

/** The fields that hold an energy in the page's unit (the pasted points' second column too). */
export const ENERGY_FIELDS = ['barrier', 'wellBarrier', 'asymmetry'] as const;

export const unitLabel = (unit: PageEnergyUnit) => ENERGY_UNIT_LABELS[unit];

/** An energy computed in kcal/mol, in the page's unit, with the unit. */
export function formatEnergy(kcalMol: number, unit: PageEnergyUnit, significant = 4): string {
	return `${formatSignificant(convertEnergy(kcalMol, 'kcal/mol', unit), significant)}\u00a0${unitLabel(unit)}`;
}

/** A typed number as it should reappear in a field after a unit change (six significant figures). */
function retype(value: number): string {
	return String(Number(value.toPrecision(6)));
}

/** A line of two cells as [first cell, what separates them, second cell], or null. */
function cellsOf(line: string, separator: Separator): [string, string, string] | null {
	if (separator === ' ') {
		const m = /^(\s*\S+)(\s+)(\S+)\s*$/.exec(line);
		return m ? [m[1]!, m[2]!, m[3]!] : null;
	}
	const cells = line.split(separator);
	return cells.length === 2 ? [cells[0]!, separator, cells[1]!] : null;
}

/**
 * The form's values with every energy converted from one unit to another (the unit switch):
 * the energy fields and the second column of the pasted points. Text that is not a number is
 * left as typed, for the action to report.
 */
export function convertFormEnergies(
	values: FormValues,
	from: PageEnergyUnit,
	to: PageEnergyUnit
): FormValues {
	if (from === to) return values;
	const next = { ...values, energyUnit: to };
	for (const name of ENERGY_FIELDS) {
		const x = readDecimal(values[name]);
		if (x !== null) next[name] = retype(convertEnergy(x, from, to));
	}
	// The points reader's separator, decided once for the text, so that the cells converted here
	// are the cells the server reads.
	const separator = separatorOf(values.pointsText);
	const decimalComma = separator !== ',';
	next.pointsText = values.pointsText
		.split('\n')
		.map((line) => {
			const cells = cellsOf(line, separator);
			if (!cells) return line;
			const [first, between, second] = cells;
			const v = readDecimal(second, { decimalComma });
			if (v === null) return line;
			const space = separator === ' ' ? '' : /^\s*/.exec(second)![0];
			return `${first}${between}${space}${retype(convertEnergy(v, from, to))}`;
		})
		.join('\n');
	return next;
}

/** The numeric fields, read by readDecimal (empty: left out, for the defaults to apply). */
export const NUMERIC_FIELDS = [
	'temperatureK',
	'imagFreqCm1',
	'barrier',
	'wellBarrier',
	'halfSeparationA',
	'asymmetry',
	'levels',
	'xMinA',
	'xMaxA',
	'points'
] as const;

/**
 * The API request the fields make (energies converted from the page's unit into the API's), the
 * line number of each pasted point, and what could not be read. Shared by the action, which
 * checks the request with the API's schema, and the page's "API:" line.
 */
export function tunnellingRequestOf(values: FormValues): {
	body: Record<string, unknown>;
	lines: number[];
	problems: RowProblem[];
	errors: FieldErrors;
} {
	const errors: FieldErrors = {};
	const unit: PageEnergyUnit = isPageEnergyUnit(values.energyUnit) ? values.energyUnit : 'kcal/mol';
	if (!isPageEnergyUnit(values.energyUnit))
		errors.energyUnit = [`expected one of ${PAGE_ENERGY_UNITS.join(', ')}`];
	const numbers: Partial<Record<(typeof NUMERIC_FIELDS)[number], number>> = {};
	for (const name of NUMERIC_FIELDS) {
		if (values[name].trim() === '') continue;
		const value = readDecimal(values[name]);
		if (value === null) errors[name] = [NOT_A_DECIMAL];
		else numbers[name] = value;
	}
	const kind = values.potentialKind;
	const sampled =
		kind === 'points'
			? parseTwoColumnText(values.pointsText, ['x', 'V'], MAX_POTENTIAL_SAMPLES)
			: { rows: [], lines: [], problems: [], tooMany: null };
	if (sampled.tooMany) errors.pointsCount = [sampled.tooMany];
	const toKcal = (v: number | undefined) =>
		v === undefined ? undefined : convertEnergy(v, unit, 'kcal/mol');
	const potential =
		kind === 'double-well'
			? {
					kind,
					barrierKcalMol: toKcal(numbers.wellBarrier),
					halfSeparationA: numbers.halfSeparationA,
					asymmetryKcalMol: toKcal(numbers.asymmetry) ?? 0
				}
			: kind === 'points'
				? {
						kind,
						points: sampled.rows.map(([xA, energy]) => ({ xA, energyKcalMol: toKcal(energy) }))
					}
				: undefined;
	const body: Record<string, unknown> = {
		temperatureK: numbers.temperatureK ?? 298.15,
		imagFreqCm1: numbers.imagFreqCm1,
		barrierKJmol:
			numbers.barrier === undefined ? undefined : convertEnergy(numbers.barrier, unit, 'kJ/mol'),
		potential,
		isotope: values.isotope || 'H',
		levels: numbers.levels ?? 6,
		xMinA: numbers.xMinA,
		xMaxA: numbers.xMaxA,
		points: numbers.points
	};
	// Left out rather than sent as undefined, as a script would write it.
	for (const key of Object.keys(body)) if (body[key] === undefined) delete body[key];
	return { body, lines: sampled.lines, problems: sampled.problems, errors };
}
