import { fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { batchDecisionSchema, reviewDecisionSchema } from '$lib/schemas/submission';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { runCurationAction } from '$lib/server/curation/outbox';
import { allowedActions } from '$lib/server/curation/transitions';
import { loadSubmissionView } from '$lib/server/curation/submissionView';
import { namesForSubmissionPage } from '$lib/server/catalogue/referenceNames';
import { viewerOf } from '$lib/server/catalogue/visibility';
import { decideBatch, decideSubmission } from '$lib/server/curation/reviews';
import { batchForPage } from '$lib/server/http/batchPage';
import { postComment } from '$lib/server/http/commentAction';
import { orNotFound, toFormFailure } from '$lib/server/http/failures';
import { attachmentStore } from '$lib/server/attachments/store';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { reviewAttachments } from './reviewAttachments';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'curator');
	const id = Number(event.params.id);
	const view = await orNotFound(loadSubmissionView(db, user, id), `no submission ${id}`);
	const batch = view.submission.channel === 'csv' ? await batchForPage(db, event.url, id) : null;
	return {
		view,
		batch,
		can: allowedActions(view.submission.status),
		// Names as this curator may see them: role does not widen visibility (visibleEntry.ts).
		names: await namesForSubmissionPage(db, viewerOf(user), view.versions, batch?.rows),
		// Files come with form submissions; a CSV batch carries none.
		attachments: batch
			? {}
			: await reviewAttachments(
					db,
					attachmentStore(),
					view.versions.map((v) => v.versionId)
				)
	};
};

// Given the database, a large approval commits in chunks (see curation/reviews.ts): the
// decisions open their own transactions.
const chunked = { ownTransactions: true };

/** One decision on the whole submission, as its form answers: the input echoed on a refusal. */
async function decideWhole(
	event: RequestEvent,
	user: ReturnType<typeof requireRole>,
	values: Record<string, FormDataEntryValue>,
	echo: Record<string, string>
) {
	const id = Number(event.params.id);
	const parsed = reviewDecisionSchema.safeParse(values);
	if (!parsed.success) return fail(400, { values: echo, errors: fieldErrors(parsed.error) });
	try {
		const outcome = await runCurationAction(
			db,
			(database) => decideSubmission(database, user, id, parsed.data, event.url.origin),
			chunked
		);
		return { decided: parsed.data.decision, approved: outcome.approved };
	} catch (e) {
		return toFormFailure(e, event, echo);
	}
}

export const actions: Actions = {
	decide: async (event) => {
		const user = requireRole(event, 'curator');
		const values = Object.fromEntries(await event.request.formData());
		return decideWhole(event, user, values, {
			decision: String(values.decision ?? ''),
			comment: String(values.comment ?? '')
		});
	},
	/**
	 * The one decision on a CSV batch: approve every row except those listed (which go back with
	 * their comments), or return or reject the whole file.
	 */
	batch: async (event) => {
		const user = requireRole(event, 'curator');
		const values = Object.fromEntries(await event.request.formData());
		const strings = {
			decision: String(values.decision ?? ''),
			returnRows: String(values.returnRows ?? ''),
			rowComments: String(values.rowComments ?? ''),
			comment: String(values.comment ?? '')
		};
		// Returning or rejecting the whole file: the same decision as on a single entry.
		if (strings.decision !== 'approve') return decideWhole(event, user, values, strings);
		const parsed = batchDecisionSchema.safeParse(values);
		if (!parsed.success) return fail(400, { values: strings, errors: fieldErrors(parsed.error) });
		const id = Number(event.params.id);
		try {
			const outcome = await runCurationAction(
				db,
				(database) => decideBatch(database, user, id, parsed.data, event.url.origin),
				chunked
			);
			return { batchDone: { approved: outcome.approved.length, returned: outcome.returned } };
		} catch (e) {
			return toFormFailure(e, event, strings);
		}
	},
	comment: async (event) => {
		const user = requireRole(event, 'curator');
		return postComment(event, user, Number(event.params.id));
	}
};
