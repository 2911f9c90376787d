import { ZERO_CELSIUS_K } from '$lib/science/constants';
import { KINDS, type EntryKind } from '$lib/kinds';
import { readDecimal } from '$lib/schemas/decimal';

/*
 * How the strings of an entry form (laid out by the kind's module, src/lib/kinds) become the
 * values the zod schemas check. The schemas stay the one judge of validity: this module only
 * reads numbers, lists and units out of text, and names what it could not read.
 */

export interface FormReading {
	/** Values typed for the schema; blanks and unreadable values are left out. */
	value: Record<string, unknown>;
	/** What could not be read as its type, by field. */
	errors: Record<string, string[]>;
}

/** A number typed into an entry form or a CSV cell (decimal commas are handled by the caller). */
export function readNumber(text: string): number | null {
	return readDecimal(text, { decimalComma: false });
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
	for (const f of KINDS[kind].formFields) {
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
	for (const f of KINDS[kind].formFields) {
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
