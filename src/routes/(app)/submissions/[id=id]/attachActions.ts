import { fail, redirect } from '@sveltejs/kit';
import { ATTACHMENT_KIND_LABELS, ATTACHMENT_KINDS } from '$lib/schemas/attachment';
import { SPECTRUM_MAX_BYTES } from '$lib/schemas/spectrumData';
import { REFERENCE_ELECTRODE_LABELS, REFERENCE_ELECTRODES } from '$lib/science/referenceElectrodes';
import { requireRole } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { readAttachmentForm } from '$lib/server/attachments/attachmentForm';
import {
	appAttachmentDeps,
	attachToSubmission,
	detachFromSubmission,
	editableVersion,
	MAX_ATTACHMENTS_PER_VERSION
} from '$lib/server/attachments/submissionAttachments';
import { SubmissionInvalidError } from '$lib/server/curation/errors';
import { toFormFailure } from '$lib/server/http/failures';
import { attachTooLargeMessage } from '$lib/server/requestLimits';
import type { RequestEvent } from './$types';

/*
 * The submission page's two file actions. Their answers are under `attach` / `detach`, apart
 * from the edit form's `values` and `errors`, so that a refused file never shows in the other
 * form. The request's declared length is checked before the body is read (requestLimits.ts lets
 * this action answer it beside the file field).
 */

/** What the attach form offers: kinds (structures go through their own flow), electrodes, limits. */
export function attachFormData() {
	return {
		kinds: ATTACHMENT_KINDS.filter((k) => k !== 'structure').map((k) => ({
			value: k,
			label: ATTACHMENT_KIND_LABELS[k]
		})),
		electrodes: REFERENCE_ELECTRODES.map((e) => ({
			value: e,
			label: REFERENCE_ELECTRODE_LABELS[e]
		})),
		maxBytes: config.ATTACHMENT_MAX_BYTES,
		maxNumbersBytes: SPECTRUM_MAX_BYTES,
		maxFiles: MAX_ATTACHMENTS_PER_VERSION
	};
}

type Values = Record<string, string>;
const refused = (status: number, errors: Record<string, string[]>, values: Values = {}) =>
	fail(status, { attach: { errors, values } });

export async function attachAction(event: RequestEvent) {
	const user = requireRole(event, 'contributor');
	const id = Number(event.params.id);
	const tooLarge = attachTooLargeMessage(Number(event.request.headers.get('content-length') ?? 0));
	if (tooLarge) return refused(413, { file: [tooLarge] });
	try {
		// Whose and which state, before the body is read (404 for someone else's).
		await editableVersion(db, user, id, null).catch((e: unknown) => {
			if (e instanceof SubmissionInvalidError) return null;
			throw e;
		});
	} catch (e) {
		const f = toFormFailure(e, event, {});
		return refused(f.status, f.data.errors);
	}
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		return refused(400, { file: ['send the form as multipart/form-data'] });
	}
	const read = await readAttachmentForm(form, { maxBytes: config.ATTACHMENT_MAX_BYTES });
	if (!read.ok) return refused(read.status, read.errors, read.values);
	try {
		await attachToSubmission(db, appAttachmentDeps(), user, id, read.input);
	} catch (e) {
		const f = toFormFailure(e, event, read.values);
		return refused(f.status, f.data.errors, read.values);
	}
	redirect(303, `/submissions/${id}?attached`);
}

export async function detachAction(event: RequestEvent) {
	const user = requireRole(event, 'contributor');
	const id = Number(event.params.id);
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		return fail(400, {
			detach: { errors: { form: ['send the form as a form (urlencoded or multipart)'] } }
		});
	}
	const attachment = Number(form.get('attachment'));
	if (!Number.isInteger(attachment) || attachment < 1)
		return fail(400, { detach: { errors: { form: ['name the file to remove'] } } });
	try {
		await detachFromSubmission(db, user, id, attachment);
	} catch (e) {
		const f = toFormFailure(e, event, {});
		return fail(f.status, { detach: { errors: f.data.errors } });
	}
	redirect(303, `/submissions/${id}?detached`);
}
