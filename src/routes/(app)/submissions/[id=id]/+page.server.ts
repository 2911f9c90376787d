import { error, fail, redirect } from '@sveltejs/kit';
import { KINDS } from '$lib/kinds';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { readSubmissionForm } from '$lib/server/curation/form';
import { checkFormEntry, warningsSeen } from '$lib/server/curation/formCheck';
import { groupsForSharing, valuesOfVersion } from '$lib/server/curation/formDefaults';
import { runCurationAction } from '$lib/server/curation/outbox';
import { allowedActions } from '$lib/server/curation/transitions';
import { loadSubmissionView, submissionKind } from '$lib/server/curation/submissionView';
import { namesForSubmissionPage } from '$lib/server/catalogue/referenceNames';
import { viewerOf } from '$lib/server/catalogue/visibility';
import { submitForReview, updateDraft, withdrawSubmission } from '$lib/server/curation/submissions';
import { batchForPage } from '$lib/server/http/batchPage';
import { postComment } from '$lib/server/http/commentAction';
import { fillFromDoi } from '$lib/server/http/doiLookup';
import { orNotFound, toFormFailure } from '$lib/server/http/failures';
import { withAttachments } from '$lib/server/attachments/submissionAttachments';
import { attachAction, attachFormData, detachAction } from './attachActions';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'contributor');
	const id = Number(event.params.id);
	const view = await withAttachments(
		db,
		await orNotFound(loadSubmissionView(db, user, id), `no submission ${id} of yours`),
		event.url
	);
	const first = view.versions[0];
	const batch = view.submission.channel === 'csv' ? await batchForPage(db, event.url, id) : null;
	return {
		view,
		can: allowedActions(view.submission.status),
		batch,
		names: await namesForSubmissionPage(db, viewerOf(user), view.versions, batch?.rows),
		groups: await groupsForSharing(db, user),
		fields: first ? KINDS[first.kind].formFields : [],
		values: first
			? valuesOfVersion(first.kind, first.data, first.requestedVisibility, first.changeNote)
			: {},
		attachForm: attachFormData(),
		notice: event.url.searchParams.has('attached')
			? 'File attached.'
			: event.url.searchParams.has('detached')
				? 'File removed from this submission.'
				: event.url.searchParams.has('uploaded')
					? 'Uploaded and submitted for review. The curators have been told.'
					: event.url.searchParams.has('submitted')
						? 'Submitted for review. The curators have been told.'
						: event.url.searchParams.has('saved')
							? 'Draft saved. Only you and the curators can see it.'
							: null
	};
};

/** The form's entry checked as submitting would check it (formCheck.ts); writes nothing. */
async function checked(event: RequestEvent) {
	const user = requireRole(event, 'contributor');
	const id = Number(event.params.id);
	const view = await orNotFound(loadSubmissionView(db, user, id), `no submission ${id}`);
	const version = view.versions[0];
	if (!version) error(404, { message: `no submission ${id}` });
	const form = readSubmissionForm(version.kind, await event.request.formData());
	if (!form.ok) return { failure: fail(400, { values: form.values, errors: form.errors }) };
	const result = await checkFormEntry(db, user, form.entry, version.accession);
	if (Object.keys(result.errors).length > 0)
		return { failure: fail(400, { values: form.values, ...result }) };
	return { user, id, form, check: result.check };
}

/**
 * Saves the edited data; with `andSubmit`, sends it for review in the same transaction, once
 * its warnings have been seen (unseen ones are shown instead).
 */
async function save(event: RequestEvent, andSubmit: boolean) {
	let user, id, form;
	if (andSubmit) {
		const r = await checked(event);
		if ('failure' in r) return r.failure;
		if (!warningsSeen(r.check, r.form.values.seenWarnings))
			return { values: r.form.values, check: r.check, unseen: true };
		({ user, id, form } = r);
	} else {
		user = requireRole(event, 'contributor');
		id = Number(event.params.id);
		const kind = await orNotFound(submissionKind(db, id), `no submission ${id}`);
		form = readSubmissionForm(kind, await event.request.formData());
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
	}
	try {
		await runCurationAction(db, async (trx) => {
			await updateDraft(trx, user, id, form);
			return andSubmit ? submitForReview(trx, user, id, event.url.origin) : { mails: [] };
		});
	} catch (e) {
		return toFormFailure(e, event, form.values);
	}
	redirect(303, `/submissions/${id}?${andSubmit ? 'submitted' : 'saved'}`);
}

export const actions: Actions = {
	submit: (event) => save(event, true),
	check: async (event) => {
		const r = await checked(event);
		if ('failure' in r) return r.failure;
		return { values: r.form.values, check: r.check };
	},
	save: (event) => save(event, false),
	lookup: async (event) => {
		requireRole(event, 'contributor');
		return fillFromDoi(await event.request.formData());
	},
	withdraw: async (event) => {
		const user = requireRole(event, 'contributor');
		const id = Number(event.params.id);
		try {
			await db.transaction().execute((trx) => withdrawSubmission(trx, user, id));
		} catch (e) {
			return toFormFailure(e, event, {});
		}
		return { withdrawn: true };
	},
	comment: async (event) => {
		const user = requireRole(event, 'contributor');
		return postComment(event, user, Number(event.params.id));
	},
	attach: attachAction,
	detach: detachAction
};
