import { resetRequestForm } from '$lib/schemas/account';
import { refuseTooManyMailRequests } from '$lib/server/http/mailRequests';
import { requestPasswordReset } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const form = await parseForm(event.request, resetRequestForm);
		if (!form.ok) return form.failure;
		const address = event.getClientAddress();
		const refusal = refuseTooManyMailRequests(address, form.data.email, form.values);
		if (refusal) return refusal;
		await requestPasswordReset(db, form.data.email, event.url.origin);
		return { sentTo: form.data.email };
	}
};
