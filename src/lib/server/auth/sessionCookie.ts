/** Auth.js's session cookie, with or without its `__Secure-` prefix and chunk suffix. */
const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?authjs\.session-token(?:\.\d+)?=/;

/**
 * Whether a request carries a session cookie at all. Without one it is signed out, and asking
 * Auth.js would only cost time and set a cookie on an answer meant for every reader.
 */
export function hasSessionCookie(request: Request): boolean {
	return SESSION_COOKIE.test(request.headers.get('cookie') ?? '');
}
