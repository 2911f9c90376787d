import { error, fail, redirect } from '@sveltejs/kit';
import { ENTRY_KINDS, KINDS, isEntryKind, type EntryKind } from '$lib/kinds';
import { isAccession } from '$lib/schemas/accession';
import { requireRole } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { readSubmissionForm } from '$lib/server/curation/form';
import { checkFormEntry, warningsSeen } from '$lib/server/curation/formCheck';
import { groupsForSharing, valuesForEditing } from '$lib/server/curation/formDefaults';
import { runCurationAction } from '$lib/server/curation/outbox';
import { createDraft, submitForReview } from '$lib/server/curation/submissions';
import { fillFromDoi } from '$lib/server/http/doiLookup';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/** The kind the path names (the route's matcher checks only its shape). */
function kindOf(param: string): EntryKind {
	if (!isEntryKind(param))
		error(404, {
			message: `no kind of entry "${param}"; expected one of ${ENTRY_KINDS.join(', ')}`
		});
	return param;
}

/** The approved entry a proposed change is for (`?edit=`), when the address names one. */
function editOf(url: URL): string | null {
	const edit = url.searchParams.get('edit');
	return edit && isAccession(edit) ? edit : null;
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
		kindLabel: KINDS[kind].label,
		fields: KINDS[kind].formFields,
		edit,
		values,
		groups: await groupsForSharing(db, user)
	};
};

/**
 * Saves a draft; with `andSubmit`, also sends it to the curators in the same transaction — once
 * the contributor has seen its warnings (formCheck.ts): unseen ones are shown instead.
 */
async function create(event: RequestEvent, andSubmit: boolean) {
	const user = requireRole(event, 'contributor');
	const form = readSubmissionForm(kindOf(event.params.kind), await event.request.formData());
	if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
	const edit = editOf(event.url);
	if (andSubmit) {
		const { errors, check } = await checkFormEntry(db, user, form.entry, edit);
		if (Object.keys(errors).length > 0) return fail(400, { values: form.values, errors, check });
		if (!warningsSeen(check, form.values.seenWarnings))
			return { values: form.values, check, unseen: true };
	}
	let result;
	try {
		result = await runCurationAction(db, async (trx) => {
			const draft = await createDraft(trx, user, {
				entry: form.entry,
				visibility: form.visibility,
				changeNote: form.changeNote,
				editAccession: edit,
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
	submit: (event) => create(event, true),
	/** What submitting would be refused for, and the warnings the curators would see. Writes nothing. */
	check: async (event) => {
		const user = requireRole(event, 'contributor');
		const form = readSubmissionForm(kindOf(event.params.kind), await event.request.formData());
		if (!form.ok) return fail(400, { values: form.values, errors: form.errors });
		const { errors, check } = await checkFormEntry(db, user, form.entry, editOf(event.url));
		if (Object.keys(errors).length > 0) return fail(400, { values: form.values, errors, check });
		return { values: form.values, check };
	},
	save: (event) => create(event, false),
	lookup: async (event) => {
		requireRole(event, 'contributor');
		return fillFromDoi(await event.request.formData());
	}
};
