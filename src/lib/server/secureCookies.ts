import type { Handle } from '@sveltejs/kit';

/**
 * Every cookie the app sets carries `Secure` exactly when the site is served over https, as
 * ORIGIN (or adapter-node's protocol header) makes `event.url` say. SvelteKit's own default
 * marks cookies Secure everywhere but http://localhost, and Auth.js's refreshed session cookie
 * reaches SvelteKit without the flag spelled out; so on a plain-http host (a lab server on its
 * LAN address) the browser would drop the session. On https the flag is always set.
 */
export const secureCookiesOnlyOverHttps: Handle = ({ event, resolve }) => {
	const secure = event.url.protocol === 'https:';
	const set = event.cookies.set.bind(event.cookies);
	// `cookies.delete` goes through `set` too.
	event.cookies.set = (name, value, options) => set(name, value, { ...options, secure });
	return resolve(event);
};
