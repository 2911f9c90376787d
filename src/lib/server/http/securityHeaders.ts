import type { Handle } from '@sveltejs/kit';
import { oidcSettings } from '../auth/oidc';
import { withHeaders } from './headers';

/*
 * Security headers on every response the app makes: pages, API JSON and CSV, redirects and
 * errors. Pages get SvelteKit's Content-Security-Policy (`kit.csp` in svelte.config.js, with the
 * hash of its inline hydration script), completed here with `form-action`; everything else
 * gets a policy under which nothing may run, load or frame it. Files under /_app and static/
 * are served by adapter-node before any hook runs and carry only their own headers.
 */
export const SECURITY_HEADERS: Readonly<Record<string, string>> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	// frame-ancestors 'none' in the policies below says the same to current browsers.
	'x-frame-options': 'DENY',
	'cross-origin-opener-policy': 'same-origin',
	'permissions-policy':
		'accelerometer=(), camera=(), geolocation=(), gyroscope=(), magnetometer=(), microphone=(), payment=(), usb=()'
};

/** For responses that are not pages: JSON, CSV, redirects, SvelteKit's and Auth.js's own texts. */
export const NON_PAGE_CSP =
	"default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

/**
 * Where forms may send people: this site, and the OpenID Connect issuer, because the sign-in
 * form's answer redirects there and browsers hold form redirects to form-action. The issuer is
 * known only at run time (the demo's fake listens on a port of its own), so this directive is
 * added here rather than in svelte.config.js.
 */
async function formAction(): Promise<string> {
	// Sign-in reports its own failure to start the issuer; the page keeps the narrower policy.
	const oidc = await oidcSettings().catch(() => null);
	return oidc ? `form-action 'self' ${new URL(oidc.issuer).origin}` : "form-action 'self'";
}

export const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const headers: Record<string, string> = {};
	for (const [name, value] of Object.entries(SECURITY_HEADERS))
		if (!response.headers.has(name)) headers[name] = value;
	if (event.url.protocol === 'https:' && !response.headers.has('strict-transport-security'))
		headers['strict-transport-security'] = 'max-age=31536000';
	const pageCsp = response.headers.get('content-security-policy')?.replace(/[;\s]+$/, '');
	if (!pageCsp) headers['content-security-policy'] = NON_PAGE_CSP;
	else if (!/(^|;)\s*form-action\s/.test(pageCsp))
		headers['content-security-policy'] = `${pageCsp}; ${await formAction()}`;
	return withHeaders(response, headers);
};
