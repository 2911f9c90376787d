import type { RequestEvent } from '@sveltejs/kit';
import { signIn } from './authjs';

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
