import { ZERO_CELSIUS_K } from '$lib/science/constants';
import { KINDS, type EntryKind } from '$lib/kinds';
import { NOT_A_DECIMAL, readDecimal } from '$lib/schemas/decimal';

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

/**
 * A number in a CSV cell (the cell reader turns a semicolon file's decimal commas into points
 * first). Forms read with `readDecimal`, which takes a decimal comma itself.
 */
export function readNumber(text: string): number | null {
	return readDecimal(text, { decimalComma: false });
}

/**
 * A temperature in K, or in °C when the text says so ("25 °C", "25,5 ℃"). Forms pass
 * `decimalComma: true`; CSV cells arrive with their decimal commas already read.
 */
export function readTemperature(
	text: string,
	options: { decimalComma?: boolean } = {}
): number | null {
	const match = /^(.*?)\s*(°\s*C|℃|C|K)?$/i.exec(text.trim());
	const value = readDecimal(match?.[1] ?? '', { decimalComma: options.decimalComma ?? false });
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

/**
 * The numbers of a typed list, as text, and how to read each. Commas separate the items unless
 * the items are already separated by spaces or semicolons and no decimal point is written: then
 * a comma inside an item is a decimal comma ("2,05 1,94 1,89" is three g-values; "2.05, 1.94",
 * "45,48,51" and "10.1,-4.2,33" are lists as before).
 */
export function splitNumberList(text: string): { items: string[]; decimalComma: boolean } {
	const bySpace = text
		.trim()
		.split(/;|\s+|,(?=\s)/)
		.map((s) => s.trim())
		.filter((s) => s !== '');
	const decimalComma =
		!text.includes('.') && bySpace.length > 1 && bySpace.some((s) => /\d,\d/.test(s));
	return { items: decimalComma ? bySpace : splitList(text, false), decimalComma };
}

/** A required choice left empty: what to choose, in the field's own words. */
export function chooseMessage(label: string): string {
	return `choose the ${label.toLowerCase()}`;
}

/** Reads a submitted form into the shape of the kind's input schema. */
export function readEntryForm(kind: EntryKind, form: Record<string, string>): FormReading {
	const value: Record<string, unknown> = {};
	const errors: Record<string, string[]> = {};
	const fail = (name: string, message: string) => (errors[name] = [message]);
	for (const f of KINDS[kind].formFields) {
		const text = (form[f.name] ?? '').trim();
		// A required choice starts empty ("choose…") so that no default slips in unseen; left
		// empty, it is named here rather than with the schema's bare "required".
		if (text === '' && f.type === 'select' && f.required) {
			fail(f.name, chooseMessage(f.label));
			continue;
		}
		// Blanks stay absent: the schema reports a required one as missing and gives an
		// optional one its default (null, an empty list, n = 1).
		if (text === '') continue;
		switch (f.type) {
			case 'number': {
				// The one reading of a typed number: Unicode minus, decimal comma, spaces.
				const n = readDecimal(text);
				if (n === null) fail(f.name, `${NOT_A_DECIMAL}; got "${text}"`);
				else value[f.name] = n;
				break;
			}
			case 'temperature': {
				const k = readTemperature(text, { decimalComma: true });
				if (k === null)
					fail(f.name, `expected a temperature such as 298 or "25 °C", got "${text}"`);
				else value[f.name] = k;
				break;
			}
			case 'numberList': {
				const list = splitNumberList(text);
				const items = list.items.map(
					(s) => [s, readDecimal(s, { decimalComma: list.decimalComma })] as const
				);
				const bad = items.find(([, n]) => n === null);
				if (bad)
					fail(f.name, `expected numbers separated by commas or spaces; "${bad[0]}" is not one`);
				else value[f.name] = items.map(([, n]) => n);
				break;
			}
			case 'textList':
				// Author names contain commas ("Family, Given"), so authors are one per line.
				value[f.name] = splitList(text, f.name === 'authors');
				break;
			case 'coordinates': {
				const list = splitNumberList(text);
				const parts = list.items.map((s) => readDecimal(s, { decimalComma: list.decimalComma }));
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
