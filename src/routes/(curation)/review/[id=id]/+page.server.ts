import { error, fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schemas/calc';
import { batchDecisionSchema, reviewDecisionSchema } from '$lib/schemas/submission';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { SubmissionNotFoundError } from '$lib/server/curation/errors';
import { curationFailure, postComment } from '$lib/server/curation/form';
import { deliver } from '$lib/server/curation/outbox';
import { loadSubmissionView } from '$lib/server/curation/queue';
import { decideBatch, decideSubmission } from '$lib/server/curation/reviews';
import { batchForPage } from '$lib/server/curation/batchPage';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'curator');
	const id = Number(event.params.id);
	const view = await loadSubmissionView(db, user, id).catch((e: unknown) => {
		if (e instanceof SubmissionNotFoundError) return null;
		throw e;
	});
	if (!view) error(404, { message: `no submission ${id}` });
	const batch = view.submission.channel === 'csv' ? await batchForPage(db, event.url, id) : null;
	return { view, batch };
};

export const actions: Actions = {
	decide: async (event) => {
		const user = requireRole(event, 'curator');
		const id = Number(event.params.id);
		const values = Object.fromEntries(await event.request.formData());
		const parsed = reviewDecisionSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, {
				values: { decision: String(values.decision ?? ''), comment: String(values.comment ?? '') },
				errors: fieldErrors(parsed.error)
			});
		}
		let outcome;
		try {
			// Given the database, a large approval commits in chunks (see curation/reviews.ts).
			outcome = await decideSubmission(db, user, id, parsed.data, event.url.origin);
		} catch (e) {
			return curationFailure(e, { decision: parsed.data.decision, comment: parsed.data.comment });
		}
		await deliver(outcome.mails);
		return { decided: parsed.data.decision, approved: outcome.approved };
	},
	/** A CSV batch row by row: approve every row except those listed, which go back with the comment. */
	batch: async (event) => {
		const user = requireRole(event, 'curator');
		const id = Number(event.params.id);
		const values = Object.fromEntries(await event.request.formData());
		const parsed = batchDecisionSchema.safeParse(values);
		const strings = {
			returnRows: String(values.returnRows ?? ''),
			rowComments: String(values.rowComments ?? ''),
			comment: String(values.comment ?? '')
		};
		if (!parsed.success) return fail(400, { values: strings, errors: fieldErrors(parsed.error) });
		let outcome;
		try {
			outcome = await decideBatch(db, user, id, parsed.data, event.url.origin);
		} catch (e) {
			return curationFailure(e, strings);
		}
		await deliver(outcome.mails);
		return { batchDone: { approved: outcome.approved.length, returned: outcome.returned } };
	},
	comment: async (event) => {
		const user = requireRole(event, 'curator');
		return postComment(event, user, Number(event.params.id));
	}
};
