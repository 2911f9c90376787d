import { signUpForm } from '$lib/schemas/account';
import { refuseTooManyMailRequests } from '$lib/server/http/mailRequests';
import { registerAccount } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions } from './$types';

export const actions: Actions = {
	/** The same answer whether or not the address has an account; the mail says which (selfService.ts). */
	default: async (event) => {
		const form = await parseForm(event.request, signUpForm);
		if (!form.ok) return form.failure;
		const { password: _password, confirm: _confirm, ...values } = form.values;
		const refusal = refuseTooManyMailRequests(event.getClientAddress(), form.data.email, values);
		if (refusal) return refusal;
		try {
			await registerAccount(db, form.data, event.url.origin);
		} catch (e) {
			// The password hashing queue is full (BusyError): 503.
			return toFormFailure(e, event, values);
		}
		return { sentTo: form.data.email };
	}
};
