import { json, text } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { API_ERROR_CODES } from '$lib/schemas/apiError';
import { apiBoundary, codeForStatus, CORS_EXPOSED_HEADERS } from '$lib/server/api/boundary';

/**
 * The API boundary (src/lib/server/api/boundary.ts) on answers made up here: what SvelteKit
 * gives for a method a route lacks (`text('POST method not allowed', 405)` with Allow, as its
 * runtime's `method_not_allowed` does), JSON errors in and out of shape, cookies. The same
 * answers over HTTP from the production build: tests/e2e/apiBoundary.test.ts.
 */
function call(
	path: string,
	init: RequestInit = {},
	answer: () => Response = () => json({ items: [] })
): Promise<Response> {
	const url = new URL(`http://hopline.test${path}`);
	let resolved = false;
	const event = { url, request: new Request(url, init), route: { id: null } };
	const resolve = async () => {
		resolved = true;
		return answer();
	};
	return Promise.resolve(apiBoundary({ event: event as never, resolve: resolve as never })).then(
		(r) => Object.assign(r, { resolved })
	);
}

describe('CORS under /api/v1', () => {
	it('lets any origin read GET and HEAD answers, without credentials, exposing what clients read', async () => {
		for (const method of ['GET', 'HEAD']) {
			const res = await call('/api/v1/potentials', {
				method,
				headers: { origin: 'https://x.test' }
			});
			expect(res.headers.get('access-control-allow-origin')).toBe('*');
			expect(res.headers.get('access-control-allow-credentials')).toBeNull();
			const exposed = res.headers.get('access-control-expose-headers')!.split(', ');
			for (const name of ['Link', 'ETag', 'Retry-After', 'RateLimit-Remaining'])
				expect(exposed).toContain(name);
			expect(exposed).toEqual(CORS_EXPOSED_HEADERS);
		}
	});

	it('grants a preflight for GET with Authorization, without asking the route', async () => {
		const res = await call('/api/v1/potentials', {
			method: 'OPTIONS',
			headers: {
				origin: 'https://x.test',
				'access-control-request-method': 'GET',
				'access-control-request-headers': 'authorization'
			}
		});
		expect(res.status).toBe(204);
		expect((res as Response & { resolved: boolean }).resolved).toBe(false);
		expect(res.headers.get('access-control-allow-origin')).toBe('*');
		expect(res.headers.get('access-control-allow-methods')).toBe('GET, HEAD');
		expect(res.headers.get('access-control-allow-headers')).toContain('Authorization');
	});

	it('grants no preflight for writes, and puts no CORS header on their answers', async () => {
		const preflight = await call(
			'/api/v1/submissions',
			{
				method: 'OPTIONS',
				headers: { origin: 'https://x.test', 'access-control-request-method': 'POST' }
			},
			() => text('OPTIONS method not allowed', { status: 405, headers: { allow: 'POST' } })
		);
		expect(preflight.status).toBe(405);
		expect(preflight.headers.get('access-control-allow-origin')).toBeNull();
		const post = await call('/api/v1/submissions', { method: 'POST', body: '{}' });
		expect(post.headers.get('access-control-allow-origin')).toBeNull();
	});

	it('leaves pages alone, /api included', async () => {
		const res = await call('/api', {}, () => new Response('<html>', { status: 405 }));
		expect(res.headers.get('access-control-allow-origin')).toBeNull();
		expect(await res.text()).toBe('<html>');
	});
});

describe('one error shape', () => {
	it("rewrites SvelteKit's plain-text 405 as JSON, keeping Allow", async () => {
		const res = await call('/api/v1/potentials', { method: 'DELETE' }, () =>
			text('DELETE method not allowed', { status: 405, headers: { allow: 'GET, HEAD' } })
		);
		expect(res.status).toBe(405);
		expect(res.headers.get('allow')).toBe('GET, HEAD');
		expect(res.headers.get('content-type')).toBe('application/json');
		expect(await res.json()).toEqual({
			error: {
				code: 'method_not_allowed',
				message: 'DELETE is not allowed on /api/v1/potentials; it answers GET, HEAD.'
			}
		});
	});

	it("rewrites a JSON error not in the shape (SvelteKit's { message }), keeping the message", async () => {
		const res = await call('/api/v1/x', {}, () =>
			json({ message: 'Not found: /api/v1/x' }, { status: 404 })
		);
		expect(await res.json()).toEqual({
			error: { code: 'not_found', message: 'Not found: /api/v1/x' }
		});
	});

	it('hides what a 500 said, keeping its error id', async () => {
		const res = await call('/api/v1/x', {}, () =>
			json({ message: 'secret stack', errorId: 'abc' }, { status: 500 })
		);
		expect(await res.json()).toEqual({
			error: {
				code: 'internal_error',
				message: 'Internal error; quote the error id when reporting it.',
				errorId: 'abc'
			}
		});
	});

	it('keeps an answer already in the shape, byte for byte', async () => {
		const body = {
			error: { code: 'not_found', message: 'no centre HL000123', fields: { a: ['b'] } }
		};
		const res = await call('/api/v1/centres', {}, () => json(body, { status: 404 }));
		expect(await res.json()).toEqual(body);
	});

	it('gives every status of the list its first code', () => {
		const first = new Map<number, string>();
		for (const [code, status] of Object.entries(API_ERROR_CODES))
			if (!first.has(status)) first.set(status, code);
		for (const status of Object.values(API_ERROR_CODES))
			expect(codeForStatus(status)).toBe(first.get(status));
		// 422: a calculation's time limit (listed first), not an unreadable file.
		expect(codeForStatus(422)).toBe('time_limit_exceeded');
		expect(codeForStatus(418)).toBe('bad_request');
		expect(codeForStatus(502)).toBe('internal_error');
	});

	it('says how to authenticate on a 401', async () => {
		const res = await call('/api/v1/submissions', { method: 'POST' }, () =>
			json({ error: { code: 'unauthorized', message: 'Sign in to do this.' } }, { status: 401 })
		);
		expect(res.headers.get('www-authenticate')).toBe('Bearer realm="Hopline API"');
	});
});

describe('no cookies from the API', () => {
	it('drops Set-Cookie (a refreshed session) from API answers, not from pages', async () => {
		const withCookie = () => {
			const res = json({ items: [] });
			res.headers.append('set-cookie', 'authjs.session-token=x; Path=/');
			return res;
		};
		expect((await call('/api/v1/potentials', {}, withCookie)).headers.get('set-cookie')).toBeNull();
		expect((await call('/search', {}, withCookie)).headers.get('set-cookie')).not.toBeNull();
	});
});
