import { describe, expect, it } from 'vitest';
import { crossSiteRefusal } from '$lib/server/http/originCheck';

// The cross-site rule as a table: which requests are refused, and with which answer.
const site = 'https://hopline.example';
const request = (path: string, init: { method?: string; headers?: Record<string, string> }) =>
	[
		new Request(site + path, { method: init.method ?? 'POST', headers: init.headers }),
		new URL(site + path)
	] as const;

describe('crossSiteRefusal', () => {
	const cases: [
		string,
		string,
		{ method?: string; headers?: Record<string, string> },
		ReturnType<typeof crossSiteRefusal>
	][] = [
		[
			'a form from this site',
			'/signin',
			{ headers: { origin: site, 'content-type': 'application/x-www-form-urlencoded' } },
			null
		],
		[
			'a form from another site',
			'/signin',
			{
				headers: { origin: 'https://x.test', 'content-type': 'application/x-www-form-urlencoded' }
			},
			'page'
		],
		[
			'a multipart page post without Origin',
			'/submissions/upload?/check',
			{ headers: { 'content-type': 'multipart/form-data; boundary=b' } },
			'page'
		],
		[
			'a post with no content type from another site',
			'/signout',
			{ headers: { origin: 'https://x.test' } },
			'page'
		],
		[
			'a GET from anywhere',
			'/signin',
			{ method: 'GET', headers: { origin: 'https://x.test' } },
			null
		],
		[
			'JSON from another site (needs a preflight)',
			'/api/v1/submissions',
			{ headers: { origin: 'https://x.test', 'content-type': 'application/json', cookie: 'a=b' } },
			null
		],
		[
			'an API multipart post without cookies or Origin (a script)',
			'/api/v1/uploads/check',
			{ headers: { 'content-type': 'multipart/form-data; boundary=b' } },
			null
		],
		[
			'an API multipart post with cookies and no Origin',
			'/api/v1/uploads/check',
			{ headers: { 'content-type': 'multipart/form-data; boundary=b', cookie: 'a=b' } },
			'api'
		],
		[
			'an API multipart post with cookies from another site',
			'/api/v1/uploads/check',
			{
				headers: {
					'content-type': 'multipart/form-data; boundary=b',
					cookie: 'a=b',
					origin: 'https://x.test'
				}
			},
			'api'
		],
		[
			'an API post with cookies from this site',
			'/api/v1/uploads/check',
			{
				headers: { 'content-type': 'multipart/form-data; boundary=b', cookie: 'a=b', origin: site }
			},
			null
		],
		[
			'Bearer without a cookie, from another site',
			'/signin',
			{
				headers: {
					'content-type': 'text/plain',
					authorization: 'Bearer t',
					origin: 'https://x.test'
				}
			},
			null
		],
		[
			'Bearer with a cookie, from another site',
			'/api/v1/uploads/check',
			{
				headers: {
					'content-type': 'text/plain',
					authorization: 'Bearer t',
					cookie: 'a=b',
					origin: 'https://x.test'
				}
			},
			'api'
		],
		[
			'a DELETE form from another site',
			'/admin/groups',
			{
				method: 'DELETE',
				headers: { 'content-type': 'application/x-www-form-urlencoded', origin: 'https://x.test' }
			},
			'page'
		]
	];
	for (const [what, path, init, expected] of cases)
		it(`${what} → ${expected ?? 'allowed'}`, () =>
			expect(crossSiteRefusal(...request(path, init))).toBe(expected));
});
