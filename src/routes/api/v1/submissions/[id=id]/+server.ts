import { json } from '@sveltejs/kit';
import { publicFieldName, toPublicFields } from '$lib/kinds/publicNames';
import { assertRole } from '$lib/server/auth/roles';
import { apiHandler } from '$lib/server/api/handler';
import { db } from '$lib/server/db';
import { withAttachments } from '$lib/server/attachments/submissionAttachments';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import type { RequestHandler } from './$types';

/** GET /api/v1/submissions/{id} — a submission with its versions (and their files), warnings, reviews and comments (its contributor or a curator). */
export const GET: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	const view = await withAttachments(
		db,
		await loadSubmissionView(db, event.locals.user, Number(event.params.id)),
		event.url
	);
	// Stored field names are mapped to their public ones (kinds/publicNames.ts).
	return json({
		...view,
		versions: view.versions.map((v) => ({
			...v,
			data: toPublicFields(v.data),
			current: v.current && { ...v.current, data: toPublicFields(v.current.data) },
			changes: v.changes.map((c) => ({ ...c, field: publicFieldName(c.field) }))
		}))
	});
});
