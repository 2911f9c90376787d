import { assertRole } from '$lib/server/auth/roles';
import { apiHandler } from '$lib/server/api/handler';
import { db } from '$lib/server/db';
import { detachFromSubmission } from '$lib/server/attachments/submissionAttachments';
import type { RequestHandler } from './$types';

/**
 * DELETE /api/v1/submissions/{id}/attachments/{attachmentId} — takes a file off the caller's own
 * draft or returned submission (an approved version keeps its files). 204.
 */
export const DELETE: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	await detachFromSubmission(
		db,
		event.locals.user,
		Number(event.params.id),
		Number(event.params.attachmentId)
	);
	return new Response(null, { status: 204 });
});
