import { error, redirect } from '@sveltejs/kit';
import { redirectTarget } from '$lib/schemas/account';
import { oidcSettings } from '$lib/server/auth/oidc';
import { signInWith } from '$lib/server/auth/signInWith';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => redirect(303, '/signin');

export const actions: Actions = {
	/** Starts OpenID Connect sign-in: Auth.js redirects to the issuer and back to /auth/callback/oidc. */
	default: async (event) => {
		if (!(await oidcSettings()))
			error(404, { message: 'OpenID Connect sign-in is not configured here.' });
		const redirectTo = redirectTarget.parse(
			(await event.request.formData()).get('redirectTo') ?? '/'
		);
		await signInWith(event, 'oidc', { redirectTo });
	}
};
