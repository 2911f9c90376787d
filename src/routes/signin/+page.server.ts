import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { redirectTarget } from '$lib/schemas/account';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { oidcSettings } from '$lib/server/auth/oidc';
import type { PasswordRefusal } from '$lib/server/auth/passwordSignIn';
import { signInWithPassword } from '$lib/server/auth/signInWith';
import { signInReason } from '$lib/signInReason';
import type { Actions, PageServerLoad } from './$types';

const form = z.object({
	email: z.string().trim().toLowerCase().email('enter the e-mail address of your account'),
	password: z.string().min(1, 'enter your password').max(1000),
	redirectTo: redirectTarget
});

// Auth.js reports why a link, an issuer sign-in or a password posted to it failed with these.
const FAILURES: Record<string, string> = {
	Verification: 'That sign-in link has expired or was already used. Ask for a new one.',
	AccessDenied: 'This account cannot sign in (it may be disabled).',
	OAuthAccountNotLinked:
		'An account with this e-mail address already exists: sign in with its password or an e-mail link.'
};

const minutes = (ms: number) => Math.max(1, Math.ceil(ms / 60_000));

/** What the form says, and with which status, for each refusal. */
function answer(refusal: PasswordRefusal): { status: number; message: string } {
	switch (refusal.reason) {
		case 'limited':
			return {
				status: 429,
				message: `Too many failed attempts. Try again in ${minutes(refusal.retryAfterMs)} minute(s).`
			};
		case 'busy':
			return {
				status: 503,
				message: 'The server is busy checking other sign-ins. Try again in a moment.'
			};
		case 'unverified':
			return {
				status: 400,
				message: 'Confirm your e-mail address first: follow the link we sent you.'
			};
		case 'wrong':
			return { status: 400, message: 'Wrong e-mail address or password.' };
	}
}

/** The message for Auth.js's `?error=…&code=…`, or null when nothing failed. */
function failureMessage(error: string | null, code: string | null): string | null {
	if (!error) return null;
	if (error === 'CredentialsSignin') {
		const reason = z.enum(['limited', 'busy', 'unverified', 'wrong']).catch('wrong').parse(code);
		return reason === 'limited'
			? 'Too many failed attempts. Try again later.'
			: answer({ ok: false, reason }).message;
	}
	return FAILURES[error] ?? 'Sign-in failed. Try again.';
}

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, '/account');
	const oidc = await oidcSettings();
	return {
		redirectTo: url.searchParams.get('redirectTo') ?? '/',
		reason: signInReason(url.searchParams.get('redirectTo')),
		failure: failureMessage(url.searchParams.get('error'), url.searchParams.get('code')),
		oidcName: oidc?.name ?? null
	};
};

export const actions: Actions = {
	/** Limits, the password check and the session all happen inside Auth.js (auth/authjs.ts). */
	default: async (event) => {
		const data = Object.fromEntries(await event.request.formData());
		const parsed = form.safeParse(data);
		const email = typeof data.email === 'string' ? data.email : '';
		if (!parsed.success) return fail(400, { email, errors: fieldErrors(parsed.error) });
		const { status, message } = answer(await signInWithPassword(event, parsed.data));
		return fail(status, { email, errors: { form: [message] } });
	}
};
