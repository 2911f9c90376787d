import { fail } from '@sveltejs/kit';
import { resetForm } from '$lib/schemas/account';
import { accountAttempts } from '$lib/server/auth/rateLimit';
import { resetPassword } from '$lib/server/auth/selfService';
import { tokenIsValid } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

/** Whether the link still works (without using it up): a dead link gets no password form. */
export const load: PageServerLoad = async (event) => ({
	linkValid: await tokenIsValid(db, 'reset', event.params.token)
});

export const actions: Actions = {
	/** Sets the password and ends every session of the account (selfService.resetPassword). */
	default: async (event) => {
		const form = await parseForm(event.request, resetForm);
		if (!form.ok) return form.failure;
		let email: string | null;
		try {
			email = await resetPassword(db, event.params.token, form.data.password);
		} catch (e) {
			// The password hashing queue is full (BusyError): 503.
			return toFormFailure(e, event);
		}
		if (!email) return fail(400, { linkDead: true as const, errors: {} });
		// Whoever reads the account's mail may sign in again at once, failed guesses forgotten.
		accountAttempts.reset(email);
		return { done: true };
	}
};
