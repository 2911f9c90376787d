import { signInLinkForm } from '$lib/schemas/account';
import { refuseTooManyMailRequests } from '$lib/server/auth/rateLimit';
import { signInWith } from '$lib/server/auth/signInWith';
import { findUserForSignIn } from '$lib/server/auth/users';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

// Auth.js sends people here after mailing a link (its "verify request" page), with ?provider=email.
export const load: PageServerLoad = ({ url }) => ({
	sent: url.searchParams.get('provider') === 'email'
});

export const actions: Actions = {
	/** Mails a one-time sign-in link to an existing, enabled account. */
	default: async (event) => {
		const form = await parseForm(event.request, signInLinkForm);
		if (!form.ok) return form.failure;
		const address = event.getClientAddress();
		const refusal = refuseTooManyMailRequests(address, form.values);
		if (refusal) return refusal;
		const user = await findUserForSignIn(db, form.data.email);
		// The same answer whether or not the account exists, so the form cannot probe for accounts.
		if (!user || user.disabledAt !== null) return { sent: true };
		await signInWith(event, 'email', { email: form.data.email, redirectTo: form.data.redirectTo });
	}
};
