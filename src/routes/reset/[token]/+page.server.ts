import { fail } from '@sveltejs/kit';
import { resetForm } from '$lib/schemas/account';
import { BusyError } from '$lib/server/auth/hashingQueue';
import { accountAttempts } from '$lib/server/auth/rateLimit';
import { resetPassword } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	/** Sets the password and ends every session of the account (selfService.resetPassword). */
	default: async (event) => {
		const form = await parseForm(event.request, resetForm);
		if (!form.ok) return form.failure;
		let email: string | null;
		try {
			email = await resetPassword(db, event.params.token, form.data.password);
		} catch (e) {
			if (e instanceof BusyError) return fail(503, { errors: { form: [e.message] } });
			throw e;
		}
		if (!email)
			return fail(400, {
				errors: {
					form: ['This link does not work: it is unknown, used already, or older than one hour.']
				}
			});
		// Whoever reads the account's mail may sign in again at once, failed guesses forgotten.
		accountAttempts.reset(email);
		return { done: true };
	}
};
