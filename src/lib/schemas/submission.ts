import { z } from 'zod';
import { ACCESSION_HINT, ACCESSION_PATTERN } from './accession';
import { KINDS, type KindModule, ENTRY_KINDS, type EntryKind } from '$lib/kinds';
import type { EntryData } from './entryData';
import { fieldErrors } from './fieldErrors';
import type { FieldErrors } from './searchParams';
import { VISIBILITIES } from './vocabulary';
import { SUBMISSION_STATES } from '$lib/catalogue/submissionStates';

/*
 * What a contributor sends: entry data in each kind's input schema (for potentials, the value as
 * reported; the normalised one is computed by the kind's module), the visibility it asks for,
 * and the curation decisions. Forms and the API share these.
 */
export type InputResult = { ok: true; entry: EntryData } | { ok: false; fields: FieldErrors };

/** Missing fields read "required" rather than zod's type message. */
const requiredMessage = (issue: { code: string; input?: unknown }) =>
	(issue.code === 'invalid_type' || issue.code === 'invalid_value') && issue.input === undefined
		? 'required'
		: undefined;

/** Validates a contributor's input for a kind and turns it into the data a version stores. */
export function parseEntryInput(kind: EntryKind, input: unknown): InputResult {
	const module: KindModule = KINDS[kind];
	const parsed = (module.input?.schema ?? module.schema).safeParse(input, {
		error: requiredMessage
	});
	if (!parsed.success) return { ok: false, fields: fieldErrors(parsed.error) };
	const converted = module.input
		? module.input.toData(parsed.data)
		: { ok: true as const, data: parsed.data };
	if (!converted.ok) return converted;
	// The data comes from the kind's own schema or conversion (see parseEntryData).
	return { ok: true, entry: { kind, data: converted.data } as EntryData };
}

/** A date such as 2027-06-30; embargoes end at the start of that day, UTC. */
const isoDay = z
	.string()
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD')
	.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'not a calendar date');

export const visibilityRequestSchema = z
	.object({
		visibility: z.enum(VISIBILITIES, { error: `expected one of ${VISIBILITIES.join(', ')}` }),
		groupId: z.coerce.number().int().positive().nullable().default(null),
		embargoUntil: isoDay.nullable().default(null)
	})
	.superRefine((v, ctx) => {
		if (v.visibility === 'group' && v.groupId === null)
			ctx.addIssue({
				code: 'custom',
				path: ['groupId'],
				message: 'choose the group that may see it'
			});
		if (v.visibility === 'embargoed') {
			if (v.embargoUntil === null)
				ctx.addIssue({
					code: 'custom',
					path: ['embargoUntil'],
					message: 'give the date it becomes public'
				});
			else if (Date.parse(`${v.embargoUntil}T00:00:00Z`) <= Date.now())
				ctx.addIssue({
					code: 'custom',
					path: ['embargoUntil'],
					message: 'the embargo must end in the future'
				});
			if (v.groupId === null)
				ctx.addIssue({
					code: 'custom',
					path: ['groupId'],
					message: 'choose the group that may see it until then'
				});
		}
	})
	.transform((v) => ({
		visibility: v.visibility,
		groupId: v.visibility === 'public' ? null : v.groupId,
		embargoUntil:
			v.visibility === 'embargoed' && v.embargoUntil ? `${v.embargoUntil}T00:00:00.000Z` : null
	}));

export type VisibilityRequest = z.output<typeof visibilityRequestSchema>;

export type VisibilityResult =
	{ ok: true; visibility: VisibilityRequest } | { ok: false; fields: FieldErrors };

/**
 * The one reading of a requested visibility, for forms, CSV uploads and the API alike.
 * @param prefix put before each field name in the errors (`visibility.` in the API's body).
 */
export function parseVisibilityRequest(input: unknown, prefix = ''): VisibilityResult {
	const parsed = visibilityRequestSchema.safeParse(input);
	if (parsed.success) return { ok: true, visibility: parsed.data };
	return { ok: false, fields: fieldErrors(parsed.error, { prefix, root: 'visibility' }) };
}

/** The visibility fields of a form: an empty choice is public, an empty group or date none. */
export function visibilityFromForm(values: Record<string, string | undefined>): VisibilityResult {
	return parseVisibilityRequest({
		visibility: values.visibility || 'public',
		groupId: values.groupId || null,
		embargoUntil: values.embargoUntil || null
	});
}

/** Form fields around the entry data: visibility, a note to curators, and which entry is edited. */
export const submissionMetaSchema = z.object({
	changeNote: z
		.string()
		.trim()
		.max(2000)
		.transform((s) => s || null)
		.nullable()
		.default(null)
});

export const entryKindParam = z.enum(ENTRY_KINDS, {
	error: `expected one of ${ENTRY_KINDS.join(', ')}`
});

export const commentBody = z
	.string()
	.trim()
	.min(1, 'write a comment')
	.max(4000, 'at most 4000 characters');

export const REVIEW_DECISIONS = ['approve', 'return', 'reject'] as const;
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];

/** A curator's decision: returning needs a comment, rejecting a reason. */
export const reviewDecisionSchema = z.discriminatedUnion(
	'decision',
	[
		z.object({ decision: z.literal('approve'), comment: z.string().trim().max(4000).default('') }),
		z.object({
			decision: z.literal('return'),
			comment: commentBody.refine((s) => s.length >= 3, 'say what needs changing')
		}),
		z.object({
			decision: z.literal('reject'),
			comment: commentBody.refine((s) => s.length >= 3, 'give the reason for rejecting')
		})
	],
	{ error: `expected a decision: ${REVIEW_DECISIONS.join(', ')}` }
);

export const CURATION_NOTICE_MODES = ['immediate', 'daily', 'off'] as const;
export const noticePreferenceForm = z.object({
	curationNotices: z.enum(CURATION_NOTICE_MODES, {
		error: `expected one of ${CURATION_NOTICE_MODES.join(', ')}`
	})
});

export { SUBMISSION_STATES } from '$lib/catalogue/submissionStates';

/** Filters of the curators' queue, from the URL. */
export const queueQuerySchema = z.strictObject({
	status: z.enum(SUBMISSION_STATES).default('submitted'),
	kind: entryKindParam.optional(),
	contributor: z.string().trim().max(200).optional(),
	flag: z.enum(['warnings', 'conflicts']).optional()
});

/**
 * A submission through the API: the entry's data in its kind's input schema (checked by
 * parseEntryInput, field paths prefixed with "data."), the visibility asked for, and whether to
 * send it for review at once or keep it as a draft.
 */
export const apiSubmissionSchema = z.strictObject({
	kind: entryKindParam,
	data: z.record(z.string(), z.unknown()),
	edit: z
		.string()
		.regex(ACCESSION_PATTERN, `the entry to change: ${ACCESSION_HINT}`)
		.nullable()
		.default(null),
	visibility: z
		.object({
			visibility: z.enum(VISIBILITIES),
			groupId: z.number().int().positive().nullable().optional(),
			embargoUntil: z.string().nullable().optional()
		})
		.default({ visibility: 'public' }),
	changeNote: z.string().trim().max(2000).nullable().default(null),
	submit: z.boolean().default(false)
});

/** Paging through a CSV batch on its review page: ?page=N&flagged=1. */
export const batchQuerySchema = z.strictObject({
	page: z.coerce.number().int().min(1).max(100_000).default(1),
	flagged: z.enum(['1', '0']).optional()
});

export const BATCH_PAGE_SIZE = 100;

/** Row numbers as people type them: "4, 9-12 15". */
export const rowListField = z
	.string()
	.trim()
	.max(20_000)
	.regex(/^[\d\s,;-]*$/, 'row numbers separated by commas, with ranges such as 9-12')
	.transform((text, ctx) => {
		const rows = new Set<number>();
		for (const part of text.split(/[\s,;]+/).filter(Boolean)) {
			const [a, b] = part.split('-').map(Number);
			if (
				a === undefined ||
				!Number.isInteger(a) ||
				(b !== undefined && (!Number.isInteger(b) || b < a))
			) {
				ctx.addIssue({
					code: 'custom',
					message: `"${part}" is not a row number or a range such as 9-12`
				});
				return z.NEVER;
			}
			for (let r = a; r <= (b ?? a); r++) rows.add(r);
		}
		return [...rows].sort((x, y) => x - y);
	});

/** One comment per returned row, a line each: "4: check the ligation" (ranges allowed: "9-12: …"). */
export const rowCommentsField = z
	.string()
	.max(100_000)
	.default('')
	.transform((text, ctx) => {
		const comments: Record<number, string> = {};
		for (const [index, line] of text.split(/\r?\n/).entries()) {
			if (!line.trim()) continue;
			// "Row 4: …" is read as "4: …" (curators write it both ways).
			const m = /^\s*(?:rows?\s*)?(\d+)(?:\s*-\s*(\d+))?\s*[:.)]\s*(.+)$/i.exec(line);
			const from = Number(m?.[1]);
			const to = m?.[2] === undefined ? from : Number(m[2]);
			if (!m || to < from) {
				ctx.addIssue({
					code: 'custom',
					message: `line ${index + 1}: expected "row: comment", e.g. "4: check the ligation"`
				});
				return z.NEVER;
			}
			for (let r = from; r <= to; r++) comments[r] = (m[3] as string).trim();
		}
		return comments;
	});

export const batchDecisionSchema = z.object({
	returnRows: rowListField.default([]),
	rowComments: rowCommentsField,
	comment: z.string().trim().max(4000).default('')
});
