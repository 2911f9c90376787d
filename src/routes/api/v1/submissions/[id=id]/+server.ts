import { json } from '@sveltejs/kit';
import { assertRole } from '$lib/server/auth/roles';
import { apiHandler } from '$lib/server/api/handler';
import { db } from '$lib/server/db';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import type { RequestHandler } from './$types';

/** GET /api/v1/submissions/{id} — a submission with its versions, warnings, reviews and comments (its contributor or a curator). */
export const GET: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	return json(await loadSubmissionView(db, event.locals.user, Number(event.params.id)));
});
