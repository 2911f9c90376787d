import { fail, redirect } from '@sveltejs/kit';
import { headerNames } from '$lib/catalogue/uploadColumns';
import type { HeaderNames } from '$lib/catalogue/headerMatch';
import { UPLOAD_KINDS, UPLOAD_KIND_LABELS, UPLOAD_KIND_NOUNS, type UploadKind } from '$lib/kinds';
import { requireRole } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { groupsForSharing } from '$lib/server/curation/formDefaults';
import { runCurationAction } from '$lib/server/curation/outbox';
import { toFormFailure } from '$lib/server/http/failures';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { summariseCheck } from '$lib/server/uploads/summary';
import { readUploadForm } from '$lib/server/uploads/uploadForm';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'contributor');
	return {
		// Names and headers as page data, so that the kinds' schemas do not ship to the browser.
		kinds: UPLOAD_KINDS,
		labels: UPLOAD_KIND_LABELS,
		nouns: UPLOAD_KIND_NOUNS,
		headerNames: Object.fromEntries(UPLOAD_KINDS.map((k) => [k, headerNames(k)])) as Record<
			UploadKind,
			HeaderNames[]
		>,
		groups: await groupsForSharing(db, user),
		limits: { bytes: config.UPLOAD_MAX_BYTES, csv: uploadCsvLimits }
	};
};

const SHOWN = { issues: 500, preview: 20 };

/** Reads and checks the posted file; a failure to return, or the check. */
async function checked(event: RequestEvent) {
	const user = requireRole(event, 'contributor');
	const form = await readUploadForm(event.request);
	if (!form.ok)
		return { user, failure: fail(form.status, { values: form.values, errors: form.errors }) };
	try {
		const check = await checkUpload(db, form.text, form.kind, {
			viewer: { groupIds: user.groupIds },
			uploaderId: user.id,
			limits: uploadCsvLimits
		});
		return { user, form, check };
	} catch (e) {
		// A CsvLimitError goes beside the file field (413): which row passed which limit.
		return { user, failure: toFormFailure(e, event, form.values) };
	}
}

export const actions: Actions = {
	/** Check only: what the file would create, and every problem in it. Writes nothing. */
	check: async (event) => {
		const r = await checked(event);
		if ('failure' in r) return r.failure;
		return { values: r.form.values, report: summariseCheck(r.check, SHOWN) };
	},
	/** Submit for review: checks again (the server never trusts an earlier answer) and commits all rows or none. */
	commit: async (event) => {
		const r = await checked(event);
		if ('failure' in r) return r.failure;
		const { user, form, check } = r;
		if (check.errorCount > 0) {
			return fail(400, {
				values: form.values,
				report: summariseCheck(check, SHOWN),
				errors: {
					form: [
						`Nothing was submitted: the file has ${check.errorCount} error(s). Fix them and try again.`
					]
				}
			});
		}
		let result;
		try {
			result = await runCurationAction(db, (trx) =>
				commitUpload(trx, user, check, {
					filename: form.filename,
					visibility: form.visibility,
					changeNote: form.changeNote,
					origin: event.url.origin,
					pendingRowsMax: config.PENDING_ROWS_MAX
				})
			);
		} catch (e) {
			return toFormFailure(e, event, form.values);
		}
		redirect(303, `/submissions/${result.submissionId}?uploaded`);
	}
};
