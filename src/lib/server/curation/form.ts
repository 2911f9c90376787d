import { error, fail, type RequestEvent } from '@sveltejs/kit';
import type { SessionUser } from '../auth/roles';
import { db } from '../db';
import { deliver } from './outbox';
import { addComment } from './reviews';
import { readEntryForm } from '$lib/catalogue/entryForm';
import type { EntryData } from '$lib/schemas/entryData';
import type { FieldErrors } from '$lib/schemas/searchParams';
import {
	commentBody,
	parseEntryInput,
	submissionMetaSchema,
	visibilityRequestSchema,
	type VisibilityRequest
} from '$lib/schemas/submission';
import type { EntryKind } from '$lib/schemas/vocabulary';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from './errors';

/*
 * Reads an entry form post: the entry data through the kind's zod schema, the visibility it
 * asks for and the note to curators. Every problem comes back at once, by field.
 */
export type SubmissionForm =
	| {
			ok: true;
			entry: EntryData;
			visibility: VisibilityRequest;
			changeNote: string | null;
			values: Record<string, string>;
	  }
	| { ok: false; values: Record<string, string>; errors: FieldErrors };

export function readSubmissionForm(kind: EntryKind, form: FormData): SubmissionForm {
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	const reading = readEntryForm(kind, values);
	const errors: FieldErrors = { ...reading.errors };
	const parsed = parseEntryInput(kind, reading.value);
	if (!parsed.ok) {
		for (const [field, messages] of Object.entries(parsed.fields)) {
			// A field the reader already named keeps the reader's clearer message.
			if (!errors[field]) errors[field] = messages;
		}
	}
	const visibility = visibilityRequestSchema.safeParse({
		visibility: values.visibility || 'public',
		groupId: values.groupId || null,
		embargoUntil: values.embargoUntil || null
	});
	if (!visibility.success) {
		for (const issue of visibility.error.issues) {
			(errors[String(issue.path[0] ?? 'visibility')] ??= []).push(issue.message);
		}
	}
	const meta = submissionMetaSchema.safeParse({ changeNote: values.changeNote ?? '' });
	if (!meta.success) errors.changeNote = meta.error.issues.map((i) => i.message);
	if (Object.keys(errors).length > 0 || !parsed.ok || !visibility.success || !meta.success) {
		return { ok: false, values, errors };
	}
	return {
		ok: true,
		entry: parsed.entry,
		visibility: visibility.data,
		changeNote: meta.data.changeNote,
		values
	};
}

/**
 * Turns a curation failure into the action's answer: 400 with field errors, 409 with a message
 * for a state that no longer allows the action, 403/404 as errors. Anything else is re-thrown.
 */
export function curationFailure(e: unknown, values: Record<string, string> = {}) {
	if (e instanceof SubmissionInvalidError) return fail(400, { values, errors: e.fields });
	if (e instanceof SubmissionStateError)
		return fail(409, { values, errors: { form: [e.message] } });
	if (e instanceof SubmissionAccessError) error(403, { message: e.message });
	if (e instanceof SubmissionNotFoundError) error(404, { message: e.message });
	throw e;
}

/** The comment form of a submission page (contributor's or curator's): validate, post, mail. */
export async function postComment(event: RequestEvent, user: SessionUser, submissionId: number) {
	const body = commentBody.safeParse((await event.request.formData()).get('body') ?? '');
	if (!body.success) {
		return fail(400, { commentErrors: { body: body.error.issues.map((i) => i.message) } });
	}
	let mails;
	try {
		mails = await db
			.transaction()
			.execute(
				async (trx) =>
					(await addComment(trx, user, submissionId, body.data, event.url.origin)).mails
			);
	} catch (e) {
		return curationFailure(e);
	}
	await deliver(mails);
	return { commented: true };
}
