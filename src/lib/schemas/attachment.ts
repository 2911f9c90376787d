import { z } from 'zod';
import { REFERENCE_ELECTRODES } from '$lib/science/referenceElectrodes';
import { temperatureKField } from './fields';

/*
 * An attachment as a contributor describes it: what it shows, a caption, and the acquisition
 * conditions that matter for its type. One schema for the form, the API's multipart upload and
 * the stored `attachment.conditions` JSON.
 */

export const ATTACHMENT_KINDS = [
	'epr_spectrum',
	'optical_spectrum',
	'mcd_spectrum',
	'voltammogram',
	'redox_titration',
	'mossbauer_spectrum',
	'structure',
	'other'
] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

export const ATTACHMENT_KIND_LABELS: Record<AttachmentKind, string> = {
	epr_spectrum: 'EPR spectrum',
	optical_spectrum: 'Optical spectrum',
	mcd_spectrum: 'MCD spectrum',
	voltammogram: 'Voltammogram',
	redox_titration: 'Redox titration plot',
	mossbauer_spectrum: 'Mössbauer spectrum',
	structure: 'Structure file',
	other: 'Other'
};

/** Which file an attachment is: an image shown with renditions, numbers to plot, a structure. */
export const ATTACHMENT_ROLES = ['image', 'data', 'structure'] as const;
export type AttachmentRole = (typeof ATTACHMENT_ROLES)[number];

export const attachmentConditionsSchema = z
	.object({
		temperatureK: temperatureKField.nullable().default(null),
		/** EPR: microwave frequency, GHz (X band ≈ 9.4, Q band ≈ 34). */
		microwaveFrequencyGHz: z
			.number()
			.min(0.1, 'microwave frequency must be at least 0.1 GHz')
			.max(1000, 'microwave frequency must be at most 1000 GHz')
			.nullable()
			.default(null),
		/** EPR: microwave power, mW. */
		microwavePowerMw: z
			.number()
			.min(0, 'microwave power cannot be negative')
			.max(10_000, 'microwave power must be at most 10 000 mW')
			.nullable()
			.default(null),
		/** EPR: field modulation amplitude, mT. */
		modulationAmplitudeMt: z
			.number()
			.min(0, 'modulation amplitude cannot be negative')
			.max(100, 'modulation amplitude must be at most 100 mT')
			.nullable()
			.default(null),
		/** Voltammetry: scan rate, mV/s. */
		scanRateMvPerS: z
			.number()
			.gt(0, 'scan rate must be positive')
			.max(1e7, 'scan rate must be at most 10 000 000 mV/s')
			.nullable()
			.default(null),
		/** Voltammetry: the reference electrode the potential axis was recorded against. */
		referenceElectrode: z.enum(REFERENCE_ELECTRODES).nullable().default(null)
	})
	.strict();
export type AttachmentConditions = z.infer<typeof attachmentConditionsSchema>;

/**
 * What a caption loses: direction overrides and isolates (they can make a caption read
 * differently from what it says), zero-width spaces and the BOM, and control characters other
 * than line breaks and tabs. Joiners stay: some scripts and emoji need them.
 */
const CAPTION_INVISIBLE =
	// eslint-disable-next-line no-control-regex -- control characters are what is removed
	/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f\u200b\u202a-\u202e\u2066-\u2069\ufeff]/g;

export const attachmentMetaSchema = z
	.object({
		kind: z.enum(ATTACHMENT_KINDS, { message: 'choose what the file shows' }),
		caption: z
			.string()
			.transform((text) => text.replace(CAPTION_INVISIBLE, ''))
			.pipe(
				z
					.string()
					.trim()
					.min(1, 'write a caption')
					.max(1000, 'a caption is at most 1000 characters')
			),
		conditions: attachmentConditionsSchema.default(attachmentConditionsSchema.parse({}))
	})
	.superRefine((meta, ctx) => {
		const c = meta.conditions;
		const epr = [c.microwaveFrequencyGHz, c.microwavePowerMw, c.modulationAmplitudeMt];
		if (meta.kind !== 'epr_spectrum' && epr.some((v) => v !== null))
			ctx.addIssue({
				code: 'custom',
				path: ['conditions'],
				message: 'microwave frequency, power and modulation apply to EPR spectra only'
			});
		if (
			meta.kind !== 'voltammogram' &&
			(c.scanRateMvPerS !== null || c.referenceElectrode !== null)
		)
			ctx.addIssue({
				code: 'custom',
				path: ['conditions'],
				message: 'scan rate and reference electrode apply to voltammograms only'
			});
	});
export type AttachmentMeta = z.infer<typeof attachmentMetaSchema>;
/** What a form or the API sends: conditions left out are null. */
export type AttachmentMetaInput = z.input<typeof attachmentMetaSchema>;

/** The longest file name kept, in code points (not UTF-16 units). */
export const FILE_NAME_MAX = 120;

/**
 * Code points that show nothing or change how the rest is shown: controls (C0, DEL, C1), format
 * characters (\p{Cf}: the bidi overrides and isolates such as U+202E that turn "gpj.exe" round,
 * zero-width spaces and joiners, the BOM, tag characters), the rest of Unicode's
 * default-ignorable set (variation selectors, Hangul fillers, the combining grapheme joiner),
 * lone surrogates, noncharacters and the line and paragraph separators. The double quote goes
 * too: it ends a quoted Content-Disposition parameter.
 */
const INVISIBLE =
	/[\p{Cc}\p{Cf}\p{Cs}\p{Zl}\p{Zp}\p{Default_Ignorable_Code_Point}\p{Noncharacter_Code_Point}"]/gu;
/** Every other space (no-break, ideographic, the typographic widths) becomes a plain one. */
const SPACES = /\p{Zs}+/gu;
/** An extension worth keeping in sight: a dot and up to 16 letters, digits, `_` or `-`. */
const EXTENSION = /\.[\p{L}\p{N}_-]{1,16}$/u;

const graphemes = new Intl.Segmenter('en', { granularity: 'grapheme' });

/**
 * The first `max` code points of `text`, cut between two graphemes (never inside a surrogate
 * pair, nor between a letter and its accent); a single grapheme longer than `max` (a letter
 * under hundreds of combining marks) is cut by code points.
 */
function firstCodePoints(text: string, max: number): string {
	let out = '';
	let count = 0;
	for (const { segment } of graphemes.segment(text)) {
		const length = [...segment].length;
		if (count + length > max) {
			if (count === 0) return [...segment].slice(0, max).join('');
			break;
		}
		out += segment;
		count += length;
	}
	return out;
}

/**
 * A file name for Content-Disposition and lists: the last path segment, in NFC, with invisible
 * and control code points removed (INVISIBLE above), runs of spaces made one, at most
 * FILE_NAME_MAX code points. A longer name loses the end of its stem, never its extension
 * ("…" marks the cut), so a reader always sees what kind of file they download; never empty.
 */
export function cleanFileName(name: string): string {
	const last = name.split(/[\\/]/).pop() ?? '';
	const visible = last
		.normalize('NFC')
		.replace(INVISIBLE, '')
		.replace(SPACES, ' ')
		.trim()
		// A name ending in dots or spaces shows another extension than it has on some systems.
		.replace(/[. ]+$/, '');
	const clean = [...visible].length <= FILE_NAME_MAX ? visible : shortened(visible, FILE_NAME_MAX);
	return clean === '' || /^\.+$/.test(clean) ? 'attachment' : clean;
}

function shortened(name: string, max: number): string {
	const extension = EXTENSION.exec(name)?.[0] ?? '';
	const stem = name.slice(0, name.length - extension.length);
	return `${firstCodePoints(stem, max - 1 - [...extension].length).trimEnd()}…${extension}`;
}
