import { error, fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schemas/calc';
import { reviewDecisionSchema } from '$lib/schemas/submission';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { SubmissionNotFoundError } from '$lib/server/curation/errors';
import { curationFailure, postComment } from '$lib/server/curation/form';
import { deliver } from '$lib/server/curation/outbox';
import { loadSubmissionView } from '$lib/server/curation/queue';
import { decideSubmission } from '$lib/server/curation/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'curator');
	const id = Number(event.params.id);
	const view = await loadSubmissionView(db, user, id).catch((e: unknown) => {
		if (e instanceof SubmissionNotFoundError) return null;
		throw e;
	});
	if (!view) error(404, { message: `no submission ${id}` });
	return { view };
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
			outcome = await db
				.transaction()
				.execute((trx) => decideSubmission(trx, user, id, parsed.data, event.url.origin));
		} catch (e) {
			return curationFailure(e, { decision: parsed.data.decision, comment: parsed.data.comment });
		}
		await deliver(outcome.mails);
		return { decided: parsed.data.decision, approved: outcome.approved };
	},
	comment: async (event) => {
		const user = requireRole(event, 'curator');
		return postComment(event, user, Number(event.params.id));
	}
};
