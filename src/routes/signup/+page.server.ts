import { fail } from '@sveltejs/kit';
import { signUpForm } from '$lib/schemas/account';
import { refuseTooManyMailRequests } from '$lib/server/auth/rateLimit';
import { AccountExistsError, registerAccount } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await parseForm(event.request, signUpForm);
		if (!form.ok) return form.failure;
		const { password: _password, confirm: _confirm, ...values } = form.values;
		const address = event.getClientAddress();
		const refusal = refuseTooManyMailRequests(address, values);
		if (refusal) return refusal;
		try {
			await registerAccount(db, form.data, event.url.origin);
		} catch (e) {
			if (e instanceof AccountExistsError)
				return fail(400, { values, errors: { email: [e.message] } });
			throw e;
		}
		return { sentTo: form.data.email };
	}
};
