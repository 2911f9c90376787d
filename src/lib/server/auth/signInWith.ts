import type { RequestEvent } from '@sveltejs/kit';
import { PasswordRefused, signIn } from './authjs';
import type { PasswordRefusal } from './passwordSignIn';

/**
 * Hands a sign-in to Auth.js from a form action. Auth.js reads the provider and its fields from
 * the request body, which the action has already read, so it gets a fresh request with exactly
 * those fields. Auth.js then redirects (to the IdP, to "check your mail", or back to the site).
 */
export async function signInWith(
	event: RequestEvent,
	providerId: 'password' | 'email' | 'oidc',
	fields: Record<string, string>
): Promise<void> {
	const body = new URLSearchParams({ providerId, ...fields });
	const headers = new Headers(event.request.headers);
	headers.set('content-type', 'application/x-www-form-urlencoded');
	headers.delete('content-length');
	// Auth.js builds its URLs from the forwarded host; the server's own origin keeps them here.
	headers.set('x-forwarded-host', event.url.host);
	headers.set('x-forwarded-proto', event.url.protocol.replace(':', ''));
	const request = new Request(event.request.url, { method: 'POST', headers, body });
	await signIn({ ...event, request });
}

/**
 * Signs in with e-mail and password through Auth.js, whose `authorize` applies the limits and
 * checks the password (auth/passwordSignIn.ts). Redirects when signed in; otherwise returns why
 * not, for the form to say.
 */
export async function signInWithPassword(
	event: RequestEvent,
	fields: { email: string; password: string; redirectTo: string }
): Promise<PasswordRefusal> {
	try {
		await signInWith(event, 'password', fields);
	} catch (e) {
		// Only the refusal is answered here; the redirect of a successful sign-in goes on up.
		if (e instanceof PasswordRefused) return e.refusal;
		throw e;
	}
	throw new Error('Auth.js neither signed in nor refused the password sign-in.');
}
