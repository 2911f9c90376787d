import { expect } from 'vitest';

/**
 * Makes a personal API token on /account as a browser without JavaScript does (a plain form
 * post answered with the page), and returns it from that page: the one place it is ever shown.
 */
export async function createTokenOnAccount(
	base: string,
	cookie: string,
	fields: { name: string; scope?: 'read' | 'read+submit'; expires?: string }
): Promise<string> {
	const res = await fetch(`${base}/account?/createToken`, {
		method: 'POST',
		headers: {
			origin: base,
			cookie,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: new URLSearchParams({ scope: 'read', expires: '', ...fields })
	});
	const html = await res.text();
	expect(res.status, html.slice(0, 500)).toBe(200);
	expect(res.headers.get('cache-control')).toBe('no-store');
	const tokens = new Set(html.match(/hlpat_[A-Za-z0-9_-]{43}/g));
	expect(tokens.size).toBe(1);
	return [...tokens][0]!;
}
