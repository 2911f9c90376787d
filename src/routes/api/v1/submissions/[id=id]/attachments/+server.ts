import { json } from '@sveltejs/kit';
import { assertRole } from '$lib/server/auth/roles';
import { apiHandler } from '$lib/server/api/handler';
import { apiError } from '$lib/server/api/respond';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { SubmissionInvalidError } from '$lib/server/curation/errors';
import { attachmentAnswer } from '$lib/server/attachments/attachmentAnswer';
import { readAttachmentForm } from '$lib/server/attachments/attachmentForm';
import {
	appAttachmentDeps,
	attachToSubmission,
	editableVersion
} from '$lib/server/attachments/submissionAttachments';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/submissions/{id}/attachments — attaches a file (multipart: entry, kind, caption,
 * conditions as flat fields, file, numbers) to a version of the caller's own draft or returned
 * submission. The request's declared length was checked before the body was read
 * (requestLimits.ts); each file is checked again here.
 */
export const POST: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	const user = event.locals.user;
	const id = Number(event.params.id);
	// Who and which state first: another contributor's submission is a 404 whatever was sent.
	await editableVersion(db, user, id, null).catch((e: unknown) => {
		// Several versions, no `entry` yet: the form below names the version.
		if (e instanceof SubmissionInvalidError) return null;
		throw e;
	});
	if (!(event.request.headers.get('content-type') ?? '').startsWith('multipart/form-data'))
		return apiError('bad_request', 'Send the file as multipart/form-data.', {
			file: ['send the file as multipart/form-data']
		});
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		return apiError('bad_request', 'The multipart body could not be read.', {
			file: ['the multipart body could not be read']
		});
	}
	const read = await readAttachmentForm(form, { maxBytes: config.ATTACHMENT_MAX_BYTES });
	if (!read.ok)
		return apiError(
			read.status === 413 ? 'payload_too_large' : 'bad_request',
			Object.entries(read.errors)
				.map(([field, messages]) => `${field}: ${messages.join('; ')}`)
				.join(' · '),
			read.errors
		);
	const { attachment } = await attachToSubmission(db, appAttachmentDeps(), user, id, read.input);
	return json(attachmentAnswer(attachment, event.url), {
		status: 201,
		headers: { location: `/files/${attachment.id}/original` }
	});
});
