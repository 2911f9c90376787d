import { fail, type RequestEvent } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { commentBody } from '$lib/schemas/submission';
import type { SessionUser } from '../auth/roles';
import { runCurationAction } from '../curation/outbox';
import { addComment } from '../curation/reviews';
import { db } from '../db';
import { toFormFailure } from './failures';

/** The comment form of a submission page (contributor's or curator's): validate, post, mail. */
export async function postComment(event: RequestEvent, user: SessionUser, submissionId: number) {
	const body = commentBody.safeParse((await event.request.formData()).get('body') ?? '');
	if (!body.success) {
		return fail(400, { commentErrors: fieldErrors(body.error, { root: 'body' }) });
	}
	try {
		await runCurationAction(db, (trx) =>
			addComment(trx, user, submissionId, body.data, event.url.origin)
		);
	} catch (e) {
		return toFormFailure(e, event, {});
	}
	return { commented: true };
}
