import { FIELD_LABELS } from '$lib/catalogue/fields';

// How a field of an entry kind is laid out in a form (and, through uploadColumns.ts, in a CSV
// file). The kinds' modules list their fields with these helpers; entryForm.ts reads them.

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
	/**
	 * A field naming another entry by accession: the form offers approved entries of this kind
	 * while typing (GET /api/v1/suggestions), and still takes an accession typed directly.
	 */
	lookup?: 'centre' | 'protein' | 'source';
}

/** A select's options from a vocabulary and, where it has them, its labels. */
export const options = <T extends string>(values: readonly T[], labels?: Record<T, string>) =>
	values.map((value) => ({ value, label: labels?.[value] ?? value }));

/** A field labelled as everywhere else in the product (FIELD_LABELS). */
export const field = (
	name: string,
	type: FormFieldType,
	extra: Partial<FormField> = {}
): FormField => ({
	name,
	label: FIELD_LABELS[name] ?? name,
	type,
	...extra
});

export const ACCESSION_HINT = 'accession, e.g. HL000123';
export const LOOKUP_HINT = 'type a name, label or accession (e.g. HL000123)';

/** A field naming an entry of another kind, with suggestions while typing. */
export const reference = (
	name: string,
	lookup: NonNullable<FormField['lookup']>,
	extra: Partial<FormField> = {}
): FormField => field(name, 'text', { hint: LOOKUP_HINT, ...extra, lookup });
export const TEMPERATURE_HINT = 'K, or °C written as "25 °C"';
