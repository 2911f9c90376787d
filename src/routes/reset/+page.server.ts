import { fail } from '@sveltejs/kit';
import { resetRequestForm } from '$lib/schemas/account';
import { mailRequests } from '$lib/server/auth/rateLimit';
import { requestPasswordReset } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await parseForm(event.request, resetRequestForm);
		if (!form.ok) return form.failure;
		const address = event.getClientAddress();
		if (mailRequests.retryAfterMs(address) > 0) {
			return fail(429, {
				values: form.values,
				errors: { form: ['Too many requests from your address; try again later.'] }
			});
		}
		mailRequests.recordFailure(address);
		await requestPasswordReset(db, form.data.email, event.url.origin);
		return { sentTo: form.data.email };
	}
};
