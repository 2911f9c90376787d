import { json } from '@sveltejs/kit';
import type { SubmissionCreated } from '$lib/schemas/curationResponses';
import { fromPublicFields, publicFieldName } from '$lib/kinds/publicNames';
import { addFieldErrors } from '$lib/schemas/fieldErrors';
import {
	apiSubmissionSchema,
	parseEntryInput,
	parseVisibilityRequest
} from '$lib/schemas/submission';
import { assertRole } from '$lib/server/auth/roles';
import { parseJsonBody } from '$lib/server/api/body';
import { apiHandler } from '$lib/server/api/handler';
import { apiError } from '$lib/server/api/respond';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { runCurationAction } from '$lib/server/curation/outbox';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import { createDraft, submitForReview } from '$lib/server/curation/submissions';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/submissions — a contributor deposits one entry (new, or with `edit` a new version
 * of an existing one) as a draft or straight into review. The same zod schemas as the forms.
 */
export const POST: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	const user = event.locals.user;
	const body = await parseJsonBody(event.request, apiSubmissionSchema);
	if (!body.ok) return body.response;
	const { kind, edit, changeNote, submit } = body.data;
	// Ångström fields may be named edgeToEdgeAngstrom or edgeToEdgeA (kinds/publicNames.ts).
	const data = fromPublicFields(body.data.data);
	const entry = data.ok
		? parseEntryInput(kind, data.data)
		: { ok: false as const, fields: data.fields };
	const visibility = parseVisibilityRequest(body.data.visibility, 'visibility.');
	const fields: Record<string, string[]> = {};
	if (!entry.ok)
		for (const [k, v] of Object.entries(entry.fields)) fields[`data.${publicFieldName(k)}`] = v;
	if (!visibility.ok) addFieldErrors(fields, visibility.fields);
	if (!entry.ok || !visibility.ok) {
		return apiError('bad_request', `Invalid field(s): ${Object.keys(fields).join(', ')}`, fields);
	}
	const result = await runCurationAction(db, async (trx) => {
		const draft = await createDraft(trx, user, {
			entry: entry.entry,
			visibility: visibility.visibility,
			changeNote,
			editAccession: edit,
			pendingRowsMax: config.PENDING_ROWS_MAX
		});
		const sent = submit
			? await submitForReview(trx, user, draft.submissionId, event.url.origin)
			: null;
		return { ...draft, mails: sent?.mails ?? [] };
	});
	const view = await loadSubmissionView(db, user, result.submissionId);
	const created: SubmissionCreated = {
		id: result.submissionId,
		accession: result.accession,
		status: view.submission.status,
		warnings: view.versions.flatMap((v) => v.warnings),
		links: {
			self: `/api/v1/submissions/${result.submissionId}`,
			page: `/submissions/${result.submissionId}`
		}
	};
	return json(created, {
		status: 201,
		headers: { location: `/api/v1/submissions/${result.submissionId}` }
	});
});
