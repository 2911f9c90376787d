import { fail } from '@sveltejs/kit';
import { resetForm } from '$lib/schemas/account';
import { resetPassword } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await parseForm(event.request, resetForm);
		if (!form.ok) return form.failure;
		const ok = await resetPassword(db, event.params.token, form.data.password);
		if (!ok)
			return fail(400, {
				errors: {
					form: ['This link does not work: it is unknown, used already, or older than one hour.']
				}
			});
		return { done: true };
	}
};
