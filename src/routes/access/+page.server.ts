import { accessRequestForm } from '$lib/schemas/admin';
import { latestAccessRequest, requestContributorAccess } from '$lib/server/admin/accessRequests';
import { requireUser } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { runCurationAction } from '$lib/server/curation/outbox';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

/* Asking for contributor access: what a reader sees after a "needs the contributor role" page. */

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const last = await latestAccessRequest(db, user.id);
	return { role: user.role, last: last ?? null };
};

export const actions: Actions = {
	request: async (event) => {
		const user = requireUser(event);
		const form = await parseForm(event.request, accessRequestForm);
		if (!form.ok) return form.failure;
		try {
			await runCurationAction(db, (trx) =>
				requestContributorAccess(trx, user, {
					message: form.data.message,
					origin: event.url.origin,
					intervalHours: config.ACCESS_REQUEST_INTERVAL_HOURS
				})
			);
		} catch (e) {
			return toFormFailure(e, event, { message: form.data.message });
		}
		return { requested: true };
	}
};
