import { z } from 'zod';
import { readDecimal, NOT_A_DECIMAL } from '$lib/schemas/decimal';
import { REFERENCE_ELECTRODES } from '$lib/science/referenceElectrodes';
import { readTemperature } from '$lib/catalogue/entryForm';
import { accessionField } from '$lib/schemas/fields';
import {
	ATTACHMENT_KINDS,
	attachmentMetaSchema,
	type AttachmentMeta
} from '$lib/schemas/attachment';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { SPECTRUM_MAX_BYTES } from '$lib/schemas/spectrumData';
import type { AttachInput } from './submissionAttachments';

/*
 * The multipart fields of one attachment, read the same way for the submission page's form and
 * the API (POST /api/v1/submissions/{id}/attachments). Flat fields rather than a JSON object, so
 * that `curl -F` and a plain HTML form send the same thing:
 *
 *   entry                 accession of the version (needed when the submission holds several)
 *   kind                  epr_spectrum, optical_spectrum, … (ATTACHMENT_KINDS)
 *   caption               text, 1–1000 characters
 *   temperature           K, or °C written as "25 °C"
 *   microwaveFrequencyGHz, microwavePowerMw, modulationAmplitudeMt   EPR only
 *   scanRateMvPerS, referenceElectrode                               voltammograms only
 *   file                  the image; or, sent alone as `numbers`, no image at all
 *   numbers               the spectrum's numbers (two-column text/CSV)
 *
 * An empty field is a field not sent (a form shows every field without JavaScript). Conditions
 * that do not apply to the kind are refused by the schema with a message saying so.
 */

export const ATTACHMENT_TEXT_FIELDS = [
	'entry',
	'kind',
	'caption',
	'temperature',
	'microwaveFrequencyGHz',
	'microwavePowerMw',
	'modulationAmplitudeMt',
	'scanRateMvPerS',
	'referenceElectrode'
] as const;
const FILE_FIELDS = ['file', 'numbers'] as const;
const DECIMAL_FIELDS = [
	'microwaveFrequencyGHz',
	'microwavePowerMw',
	'modulationAmplitudeMt',
	'scanRateMvPerS'
] as const;

export type AttachmentFormValues = Partial<Record<(typeof ATTACHMENT_TEXT_FIELDS)[number], string>>;

export type AttachmentFormResult =
	| { ok: true; input: AttachInput; values: AttachmentFormValues }
	| { ok: false; status: 400 | 413; errors: FieldErrors; values: AttachmentFormValues };

const bytes = (n: number) => n.toLocaleString('en-GB').replace(/,/g, '\u202f');
/** "1 048 577 bytes; the limit is 1 048 576 bytes (1.0 MB)": exact, since MB round alike. */
const overLimit = (what: string, size: number, limit: number) =>
	`${what} is ${bytes(size)} bytes; the limit is ${bytes(limit)} bytes (${(limit / 1024 / 1024).toFixed(1)} MB)`;

/** A File that was chosen (a browser sends an empty, nameless one for a file input left alone). */
function chosen(v: FormDataEntryValue | null): File | null {
	return v instanceof File && (v.size > 0 || v.name !== '') ? v : null;
}

/**
 * More parts than any honest form sends (each field once, a few framework fields beside them):
 * past it the form is refused whole, so the answer stays short however many parts arrive.
 */
export const ATTACHMENT_FORM_MAX_PARTS = 32;
/** Unknown field names quoted in the answer, at most (each cut to 40 characters). */
const UNKNOWN_NAMES_SHOWN = 5;

/** Reads and checks the fields; file bytes are read only once every other field is valid. */
export async function readAttachmentForm(
	form: FormData,
	limits: { maxBytes: number }
): Promise<AttachmentFormResult> {
	const values: AttachmentFormValues = {};
	const errors: FieldErrors = {};
	const add = (field: string, message: string) => (errors[field] ??= []).push(message);
	const allFields = [...ATTACHMENT_TEXT_FIELDS, ...FILE_FIELDS].join(', ');
	const unknown: string[] = [];
	let parts = 0;
	for (const [key, value] of form) {
		if (++parts > ATTACHMENT_FORM_MAX_PARTS)
			return {
				ok: false,
				status: 400,
				errors: {
					form: [
						`the form has more than ${ATTACHMENT_FORM_MAX_PARTS} parts; send each of these at most once: ${allFields}`
					]
				},
				values: {}
			};
		if ((ATTACHMENT_TEXT_FIELDS as readonly string[]).includes(key)) {
			if (typeof value !== 'string') add(key, 'send this field as text, not a file');
			else if (value.trim() !== '') values[key as keyof AttachmentFormValues] = value.trim();
		} else if (!(FILE_FIELDS as readonly string[]).includes(key)) {
			unknown.push(key);
		} else if (typeof value === 'string' && value !== '') {
			add(key, 'send a file here (multipart/form-data), not text');
		}
	}
	if (unknown.length > 0) {
		const shown = unknown.slice(0, UNKNOWN_NAMES_SHOWN).map((k) => JSON.stringify(k.slice(0, 40)));
		const more = unknown.length - shown.length;
		add(
			'form',
			`unknown field${unknown.length > 1 ? 's' : ''} ${shown.join(', ')}${more > 0 ? ` and ${more} more` : ''}; the fields are ${allFields}`
		);
	}

	let accession: string | null = null;
	if (values.entry !== undefined) {
		const a = accessionField.safeParse(values.entry);
		if (a.success) accession = a.data;
		else add('entry', 'an accession such as HL000123');
	}
	const conditions: Record<string, unknown> = {};
	if (values.temperature !== undefined) {
		const k = readTemperature(values.temperature, { decimalComma: true });
		if (k === null) add('temperature', 'a temperature such as 15 (K) or "25 °C"');
		else conditions.temperatureK = k;
	}
	for (const field of DECIMAL_FIELDS) {
		const text = values[field];
		if (text === undefined) continue;
		const n = readDecimal(text);
		if (n === null) add(field, NOT_A_DECIMAL);
		else conditions[field] = n;
	}
	if (values.referenceElectrode !== undefined)
		conditions.referenceElectrode = values.referenceElectrode;
	if (values.kind === 'structure')
		add(
			'kind',
			'structure files are kept through the structure upload (/submissions/upload/structure), which reads them'
		);
	let meta: AttachmentMeta | null = null;
	const parsed = attachmentMetaSchema.safeParse({
		kind: values.kind,
		caption: values.caption ?? '',
		conditions
	});
	if (parsed.success) meta = parsed.data;
	else
		for (const issue of parsed.error.issues) {
			const [first, second] = issue.path;
			const field =
				first === 'conditions' && typeof second === 'string'
					? second === 'temperatureK'
						? 'temperature'
						: second
					: String(first ?? 'form');
			if (!errors[field]?.includes(issue.message)) add(field, issue.message);
		}

	const image = chosen(form.get('file'));
	const numbers = chosen(form.get('numbers'));
	if (!image && !numbers)
		add('file', 'choose an image (PNG, JPEG, GIF, BMP or TIFF), or a numbers file alone');
	if (Object.keys(errors).length > 0 || !meta) return { ok: false, status: 400, errors, values };

	// Sizes as sent, before the bytes are read (the request as a whole was bounded before).
	const tooLarge: FieldErrors = {};
	if (image && image.size > limits.maxBytes)
		tooLarge.file = [overLimit('the image', image.size, limits.maxBytes)];
	if (numbers && numbers.size > SPECTRUM_MAX_BYTES)
		tooLarge.numbers = [overLimit('the numbers file', numbers.size, SPECTRUM_MAX_BYTES)];
	if (Object.keys(tooLarge).length > 0) return { ok: false, status: 413, errors: tooLarge, values };

	const read = async (f: File) => ({
		fileName: f.name,
		bytes: new Uint8Array(await f.arrayBuffer())
	});
	const input: AttachInput = image
		? {
				accession,
				meta,
				file: await read(image),
				numbers: numbers ? await read(numbers) : null,
				numbersOnly: false
			}
		: { accession, meta, file: await read(numbers as File), numbers: null, numbersOnly: true };
	return { ok: true, input, values };
}

/**
 * The multipart body as the OpenAPI document describes it. The route reads it with
 * `readAttachmentForm` (text fields to numbers, °C to K, then `attachmentMetaSchema`).
 */
export const attachmentMultipartSchema = z.strictObject({
	entry: accessionField
		.optional()
		.describe(
			'The accession of the version the file belongs to; needed when the submission holds several.'
		),
	kind: z.enum(ATTACHMENT_KINDS).describe('What the file shows.'),
	caption: z
		.string()
		.min(1)
		.max(1000)
		.describe('What the figure shows, as under a figure in a paper.'),
	temperature: z
		.string()
		.optional()
		.describe('Temperature of the measurement: K, or °C written as "25 °C".'),
	microwaveFrequencyGHz: z.string().optional().describe('EPR only: microwave frequency, GHz.'),
	microwavePowerMw: z.string().optional().describe('EPR only: microwave power, mW.'),
	modulationAmplitudeMt: z
		.string()
		.optional()
		.describe('EPR only: field modulation amplitude, mT.'),
	scanRateMvPerS: z.string().optional().describe('Voltammograms only: scan rate, mV/s.'),
	referenceElectrode: z
		.enum(REFERENCE_ELECTRODES)
		.optional()
		.describe('Voltammograms only: the reference electrode of the potential axis.'),
	file: z
		.file()
		.optional()
		.describe(
			'The image: PNG, JPEG, GIF, BMP or TIFF (type read from its bytes), at most ATTACHMENT_MAX_BYTES (10 MB by default). Leave out to attach the numbers alone.'
		),
	numbers: z
		.file()
		.optional()
		.describe(
			'The spectrum’s numbers: two-column text or CSV (x, y; a header with names and units), at most 1 MB and 20 000 points.'
		)
});
