import { signInLinkForm } from '$lib/schemas/account';
import { TOO_MANY_MAIL_REQUESTS } from '$lib/server/auth/rateLimit';
import { signInWith } from '$lib/server/auth/signInWith';
import { parseForm } from '$lib/server/http/forms';
import type { Actions, PageServerLoad } from './$types';

// Auth.js sends people here after mailing a link (its "verify request" page), with ?provider=email,
// and, when the mail limits refuse the request, with ?error=TooManyRequests (auth/authjs.ts).
export const load: PageServerLoad = ({ url }) => ({
	sent: url.searchParams.get('provider') === 'email',
	refused: url.searchParams.get('error') === 'TooManyRequests' ? TOO_MANY_MAIL_REQUESTS : null
});

export const actions: Actions = {
	/**
	 * Asks Auth.js to mail a one-time sign-in link. Whether an account exists or not, the answer
	 * is the same redirect to "a link is on its way" (the limits and that rule live in Auth.js's
	 * signIn callback, so they hold for direct POSTs to /auth/signin/email too).
	 */
	default: async (event) => {
		const form = await parseForm(event.request, signInLinkForm);
		if (!form.ok) return form.failure;
		await signInWith(event, 'email', { email: form.data.email, redirectTo: form.data.redirectTo });
	}
};
