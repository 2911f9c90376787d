import { REFERENCE_ELECTRODES, REFERENCE_ELECTRODE_LABELS } from '$lib/science/referenceElectrodes';
import { POTENTIAL_UNITS } from '$lib/science/units';
import { ZERO_CELSIUS_K } from '$lib/science/constants';
import {
	COFACTOR_KINDS,
	COFACTOR_KIND_LABELS,
	COUPLES_BY_KIND,
	DISTANCE_METHODS,
	DISTANCE_METHOD_LABELS,
	POTENTIAL_METHODS,
	POTENTIAL_METHOD_LABELS,
	SOURCE_KINDS,
	SPIN_METHODS,
	SPIN_METHOD_LABELS,
	type EntryKind
} from '$lib/schemas/vocabulary';
import { FIELD_LABELS } from './fields';

/*
 * How each kind of entry is laid out as an HTML form, and how the form's strings become the
 * values the zod schemas check. The schemas stay the one judge of validity: this module only
 * reads numbers, lists and units out of text, and names what it could not read.
 */

export type FormFieldType =
	| 'text'
	| 'textarea'
	| 'number'
	| 'temperature'
	| 'select'
	| 'textList'
	| 'numberList'
	| 'coordinates';

export interface FormField {
	name: string;
	label: string;
	type: FormFieldType;
	required?: boolean;
	unit?: string;
	hint?: string;
	options?: readonly { value: string; label: string }[];
	/** Suggestions offered while typing (an HTML datalist). */
	suggestions?: readonly string[];
}

const options = <T extends string>(values: readonly T[], labels?: Record<T, string>) =>
	values.map((value) => ({ value, label: labels?.[value] ?? value }));

const field = (name: string, type: FormFieldType, extra: Partial<FormField> = {}): FormField => ({
	name,
	label: FIELD_LABELS[name] ?? name,
	type,
	...extra
});

const ACCESSION_HINT = 'accession, e.g. HL000123';
const TEMPERATURE_HINT = 'K, or °C written as "25 °C"';

const ALL_COUPLES = [...new Set(Object.values(COUPLES_BY_KIND).flat())];

export const ENTRY_FORM_FIELDS: Record<EntryKind, readonly FormField[]> = {
	protein: [
		field('name', 'text', { required: true }),
		field('organism', 'text', { required: true }),
		field('uniprot', 'text', { hint: 'UniProtKB accession, e.g. P69905' }),
		field('structureIds', 'textList', { hint: 'PDB or model identifiers, comma-separated' }),
		field('description', 'textarea')
	],
	centre: [
		field('proteinAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('label', 'text', { required: true, hint: 'as in the source, e.g. N2 or heme bL' }),
		field('cofactorKind', 'select', {
			required: true,
			options: options(COFACTOR_KINDS, COFACTOR_KIND_LABELS)
		}),
		field('ligation', 'text', { hint: 'e.g. Cys4, Cys3His, Cys2His2' }),
		field('chainId', 'text'),
		field('residues', 'numberList', { hint: 'residue numbers, comma-separated' }),
		field('coordinatesA', 'coordinates', { unit: 'Å', hint: 'x, y, z of the centroid' }),
		field('note', 'textarea')
	],
	potential: [
		field('centreAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('couple', 'text', {
			required: true,
			suggestions: ALL_COUPLES,
			hint: 'oxidised/reduced level, e.g. [4Fe-4S]2+/1+'
		}),
		field('reportedValue', 'number', { required: true, hint: 'as reported, before conversion' }),
		field('reportedUnit', 'select', { required: true, options: options(POTENTIAL_UNITS) }),
		field('referenceElectrode', 'select', {
			required: true,
			options: options(REFERENCE_ELECTRODES, REFERENCE_ELECTRODE_LABELS)
		}),
		field('ph', 'number'),
		field('temperatureK', 'temperature', { unit: 'K', hint: TEMPERATURE_HINT }),
		field('ionicStrengthM', 'number', { unit: 'M' }),
		field('buffer', 'text'),
		field('method', 'select', {
			required: true,
			options: options(POTENTIAL_METHODS, POTENTIAL_METHOD_LABELS)
		}),
		field('nElectrons', 'number', { hint: '1 unless the couple is a two-electron one' }),
		field('uncertaintyMv', 'number', { unit: 'mV', hint: 'one standard uncertainty' }),
		field('sourceAccession', 'text', { hint: ACCESSION_HINT }),
		field('note', 'textarea')
	],
	spin_record: [
		field('centreAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('oxidationLevel', 'text', { required: true, hint: 'e.g. [4Fe-4S]1+ or Fe3+' }),
		field('spinS', 'number', { required: true, hint: 'whole or half-whole, e.g. 1/2 as 0.5' }),
		field('gValues', 'numberList', { hint: 'one, two or three principal values' }),
		field('temperatureK', 'temperature', { unit: 'K', hint: TEMPERATURE_HINT }),
		field('method', 'select', {
			required: true,
			options: options(SPIN_METHODS, SPIN_METHOD_LABELS)
		}),
		field('sourceAccession', 'text', { hint: ACCESSION_HINT }),
		field('note', 'textarea')
	],
	distance: [
		field('centreAAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('centreBAccession', 'text', { required: true, hint: ACCESSION_HINT }),
		field('edgeToEdgeA', 'number', { required: true, unit: 'Å' }),
		field('centreToCentreA', 'number', { unit: 'Å' }),
		field('structureId', 'text', { required: true, hint: 'e.g. a PDB identifier' }),
		field('method', 'select', {
			required: true,
			options: options(DISTANCE_METHODS, DISTANCE_METHOD_LABELS)
		}),
		field('sourceAccession', 'text', { hint: ACCESSION_HINT }),
		field('note', 'textarea')
	],
	source: [
		field('sourceKind', 'select', {
			required: true,
			options: options(SOURCE_KINDS, { publication: 'publication', dataset: 'unpublished dataset' })
		}),
		field('doi', 'text', { hint: 'e.g. 10.5555/12345678; look it up to fill the rest' }),
		field('pubmedId', 'text'),
		field('title', 'text', { required: true }),
		field('authors', 'textList', {
			required: true,
			hint: '"Family, Given", one per line'
		}),
		field('journal', 'text'),
		field('year', 'number'),
		field('note', 'textarea')
	]
};

export interface FormReading {
	/** Values typed for the schema; blanks and unreadable values are left out. */
	value: Record<string, unknown>;
	/** What could not be read as its type, by field. */
	errors: Record<string, string[]>;
}

/** The trade writes minus signs and decimal points several ways; read them all. */
export function readNumber(text: string): number | null {
	const normalised = text
		.trim()
		.replace(/[\u2212\u2012\u2013]/g, '-')
		.replace(/\s+/g, '');
	if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(normalised)) return null;
	return Number(normalised);
}

export function readTemperature(text: string): number | null {
	const match = /^(.*?)\s*(°\s*C|℃|C|K)?$/i.exec(text.trim());
	const value = readNumber(match?.[1] ?? '');
	if (value === null) return null;
	const celsius = /c|℃/i.test(match?.[2] ?? '');
	const kelvin = celsius ? value + ZERO_CELSIUS_K : value;
	// Below absolute zero is unreadable, not merely out of range.
	return kelvin < 0 ? null : Math.round(kelvin * 100) / 100;
}

function splitList(text: string, byLine: boolean): string[] {
	return text
		.split(byLine ? /\r?\n|;/ : /[,;\s]+/)
		.map((s) => s.trim())
		.filter((s) => s !== '');
}

/** Reads a submitted form into the shape of the kind's input schema. */
export function readEntryForm(kind: EntryKind, form: Record<string, string>): FormReading {
	const value: Record<string, unknown> = {};
	const errors: Record<string, string[]> = {};
	const fail = (name: string, message: string) => (errors[name] = [message]);
	for (const f of ENTRY_FORM_FIELDS[kind]) {
		const text = (form[f.name] ?? '').trim();
		// Blanks stay absent: the schema reports a required one as missing and gives an
		// optional one its default (null, an empty list, n = 1).
		if (text === '') continue;
		switch (f.type) {
			case 'number': {
				const n = readNumber(text);
				if (n === null) fail(f.name, `expected a number, got "${text}"`);
				else value[f.name] = n;
				break;
			}
			case 'temperature': {
				const k = readTemperature(text);
				if (k === null)
					fail(f.name, `expected a temperature such as 298 or "25 °C", got "${text}"`);
				else value[f.name] = k;
				break;
			}
			case 'numberList': {
				const items = splitList(text, false).map((s) => [s, readNumber(s)] as const);
				const bad = items.find(([, n]) => n === null);
				if (bad) fail(f.name, `expected numbers separated by commas; "${bad[0]}" is not one`);
				else value[f.name] = items.map(([, n]) => n);
				break;
			}
			case 'textList':
				// Author names contain commas ("Family, Given"), so authors are one per line.
				value[f.name] = splitList(text, f.name === 'authors');
				break;
			case 'coordinates': {
				const parts = splitList(text, false).map(readNumber);
				if (parts.length !== 3 || parts.some((n) => n === null))
					fail(f.name, `expected three numbers x, y, z, got "${text}"`);
				else value[f.name] = { x: parts[0], y: parts[1], z: parts[2] };
				break;
			}
			default:
				value[f.name] = text;
		}
	}
	return { value, errors };
}

/** The form's text for a stored value: the inverse of readEntryForm, for editing. */
export function entryFormValues(
	kind: EntryKind,
	data: Record<string, unknown>
): Record<string, string> {
	const out: Record<string, string> = {};
	for (const f of ENTRY_FORM_FIELDS[kind]) {
		const v = data[f.name];
		if (v === null || v === undefined) out[f.name] = '';
		else if (Array.isArray(v)) out[f.name] = v.join(f.name === 'authors' ? '\n' : ', ');
		else if (f.type === 'coordinates' && typeof v === 'object') {
			const c = v as { x: number; y: number; z: number };
			out[f.name] = `${c.x}, ${c.y}, ${c.z}`;
		} else out[f.name] = String(v);
	}
	return out;
}
