import { text, type Handle } from '@sveltejs/kit';
import { apiError } from '../api/respond';

/*
 * Cross-site request forgery protection, in place of SvelteKit's own origin check (turned off
 * with `csrf.trustedOrigins: ['*']` in svelte.config.js), so that the API can answer in its
 * JSON error shape and scripts can call it without pretending to be a browser.
 *
 * A browser lets any site send a POST, PUT, PATCH or DELETE to us without asking first only when
 * it looks like a form: url-encoded, multipart or plain-text body (or none at all). Such a
 * request carries the visitor's cookies, so it is refused unless its Origin header is ours:
 * - on pages and form actions always, as SvelteKit does (a signed-out form can still be abused,
 *   e.g. to sign a visitor in to someone else's account), with SvelteKit's own text;
 * - under /api/ only when it carries cookies, in the API's error shape: a script that
 *   authenticates otherwise (a personal API token, http/bearer.ts) has nothing to forge.
 * A request with `Authorization: Bearer` and no cookie is never refused here. JSON and other
 * content types need a CORS preflight from another site, which this app never grants.
 */
const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const FORM_TYPES = new Set([
	'',
	'application/x-www-form-urlencoded',
	'multipart/form-data',
	'text/plain',
	// SvelteKit's binary form encoding for remote functions
	'application/x-sveltekit-formdata'
]);

/** Which refusal a request gets: none, the API's JSON 403, or the pages' 403. */
export function crossSiteRefusal(request: Request, url: URL): null | 'api' | 'page' {
	if (!UNSAFE_METHODS.has(request.method)) return null;
	const type = (request.headers.get('content-type') ?? '').split(';', 1)[0]?.trim().toLowerCase();
	if (!FORM_TYPES.has(type ?? '')) return null;
	if (request.headers.get('origin') === url.origin) return null;
	const cookies = request.headers.has('cookie');
	if (!cookies && /^Bearer\s/i.test(request.headers.get('authorization') ?? '')) return null;
	if (url.pathname === '/api' || url.pathname.startsWith('/api/')) return cookies ? 'api' : null;
	return 'page';
}

export const checkOrigin: Handle = ({ event, resolve }) => {
	const { request, url } = event;
	const refusal = crossSiteRefusal(request, url);
	if (refusal === null) return resolve(event);
	const from = request.headers.get('origin');
	if (refusal === 'api') {
		return apiError(
			'forbidden',
			`A ${request.method} that carries cookies must come from this site's own pages (Origin ${url.origin}); this one came ${from ? `from ${from}` : 'without an Origin header'}. A script that signs in with a cookie sends "Origin: ${url.origin}" with it.`
		);
	}
	const message = `Cross-site ${request.method} form submissions are forbidden`;
	return request.headers.get('accept') === 'application/json'
		? Response.json({ message }, { status: 403 })
		: text(message, { status: 403 });
};
