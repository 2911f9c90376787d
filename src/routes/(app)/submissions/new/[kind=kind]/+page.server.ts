import { error, fail, redirect } from '@sveltejs/kit';
import { ENTRY_KINDS, KINDS, isEntryKind, type EntryKind } from '$lib/kinds';
import { isAccession } from '$lib/schemas/accession';
import { requireRole } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { readSubmissionForm } from '$lib/server/curation/form';
import { groupsForSharing, valuesForEditing } from '$lib/server/curation/formDefaults';
import { runCurationAction } from '$lib/server/curation/outbox';
import { createDraft, submitForReview } from '$lib/server/curation/submissions';
import { fillFromDoi } from '$lib/server/http/doiLookup';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

/** The kind the path names (the route's matcher checks only its shape). */
function kindOf(param: string): EntryKind {
	if (!isEntryKind(param))
		error(404, {
			message: `no kind of entry "${param}"; expected one of ${ENTRY_KINDS.join(', ')}`
		});
	return param;
}

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'contributor');
	const kind = kindOf(event.params.kind);
	const edit = event.url.searchParams.get('edit');
	let values: Record<string, string> = {};
	if (edit !== null) {
		if (!isAccession(edit))
			error(400, { message: `edit: expected an accession such as HL000123, got "${edit}"` });
		const existing = await valuesForEditing(db, user, kind, edit);
		if (!existing) error(404, { message: `no ${kind.replace('_', ' ')} ${edit} that you can see` });
		values = existing;
	}
	return {
		kind,
		fields: KINDS[kind].formFields,
		edit,
		values,
		groups: await groupsForSharing(db, user)
	};
};

/** Both actions create the draft; `submit` also sends it to the curators in the same transaction. */
async function create(event: Parameters<Actions[string]>[0], andSubmit: boolean) {
	const user = requireRole(event, 'contributor');
	const form = readSubmissionForm(kindOf(event.params.kind), await event.request.formData());
	if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
	const edit = event.url.searchParams.get('edit');
	let result;
	try {
		result = await runCurationAction(db, async (trx) => {
			const draft = await createDraft(trx, user, {
				entry: form.entry,
				visibility: form.visibility,
				changeNote: form.changeNote,
				editAccession: edit && isAccession(edit) ? edit : null,
				pendingRowsMax: config.PENDING_ROWS_MAX
			});
			const sent = andSubmit
				? await submitForReview(trx, user, draft.submissionId, event.url.origin)
				: { mails: [] };
			return { ...draft, mails: sent.mails };
		});
	} catch (e) {
		return toFormFailure(e, event, form.values);
	}
	redirect(303, `/submissions/${result.submissionId}?${andSubmit ? 'submitted' : 'saved'}`);
}

export const actions: Actions = {
	save: (event) => create(event, false),
	submit: (event) => create(event, true),
	lookup: async (event) => {
		requireRole(event, 'contributor');
		return fillFromDoi(await event.request.formData());
	}
};
