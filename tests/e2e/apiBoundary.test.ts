import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { expectApiError } from '../support/apiErrors';
import { createTokenOnAccount } from '../support/apiTokens';
import { launchChromium, submitSignIn } from '../support/browser';
import { signInCookie } from '../support/session';

/**
 * What every /api/v1 answer shares (src/lib/server/api/boundary.ts), over HTTP against the
 * production build: errors of each status in the one JSON shape, 405 with Allow, no cookies,
 * CORS for reads — and in Chromium, from a page on another loopback origin (a server of this
 * file's own): public reads and token reads work, a cookie session does not, writes do not
 * reach the API. The 429 of a token's rate limit: tests/e2e/apiTokens.test.ts.
 */
const base = inject('baseUrl');
let contributor = '';
let reader = '';

beforeAll(async () => {
	contributor = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	reader = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
});

const json = (body: unknown) => ({
	headers: { 'content-type': 'application/json' },
	body: JSON.stringify(body)
});

describe('every API error in the one shape', () => {
	it('401 for a write without credentials, saying how to authenticate', async () => {
		const res = await fetch(`${base}/api/v1/submissions`, { method: 'POST', ...json({}) });
		expect(res.headers.get('www-authenticate')).toBe('Bearer realm="Hopline API"');
		await expectApiError(res, 401, 'unauthorized');
	});

	it('403 for a role too low, and for a cross-site post with cookies', async () => {
		const low = await fetch(`${base}/api/v1/submissions`, {
			method: 'POST',
			headers: { cookie: reader, origin: base, 'content-type': 'application/json' },
			body: '{}'
		});
		await expectApiError(low, 403, 'forbidden');
		const crossSite = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: {
				cookie: contributor,
				origin: 'https://elsewhere.test',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: 'imagFreqCm1=900'
		});
		const error = await expectApiError(crossSite, 403, 'forbidden');
		expect(error.message).toContain(`Origin ${base}`);
	});

	it('404 for an unknown path and an unknown accession', async () => {
		await expectApiError(await fetch(`${base}/api/v1/nothing-here`), 404, 'not_found');
		await expectApiError(await fetch(`${base}/api/v1/entries/HL999998`), 404, 'not_found');
	});

	it('405 with Allow for a method a route does not have, and for OPTIONS', async () => {
		const cases: [string, string, string][] = [
			['POST', '/api/v1/potentials', 'GET, HEAD'],
			['DELETE', '/api/v1/submissions', 'POST'],
			['PUT', '/api/v1/entries/HL000001', 'GET, HEAD'],
			['OPTIONS', '/api/v1/facets', 'GET, HEAD'],
			['OPTIONS', '/api/v1/submissions', 'POST']
		];
		for (const [method, path, allow] of cases) {
			const res = await fetch(`${base}${path}`, {
				method,
				headers: { origin: base, 'content-type': 'application/json' },
				...(method === 'OPTIONS' ? {} : { body: '{}' })
			});
			expect(res.headers.get('allow'), `${method} ${path}`).toBe(allow);
			const error = await expectApiError(res, 405, 'method_not_allowed');
			expect(error.message).toContain(path);
		}
	});

	it('413 for a body over BODY_MAX_BYTES', async () => {
		const res = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie: contributor, origin: base },
			body: Buffer.alloc(3 * 1024 * 1024, ' ')
		});
		const error = await expectApiError(res, 413, 'payload_too_large');
		expect(error.message).toContain('the limit is 2.0 MB');
	});

	it('411 for a body without Content-Length', async () => {
		const answer = await new Promise<{ status: number; body: string }>((resolve, reject) => {
			const req = http.request(`${base}/api/v1/calc/tunnelling`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked' }
			});
			req.on('response', (res) => {
				let body = '';
				res.on('data', (d: Buffer) => (body += d.toString()));
				res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
			});
			req.on('error', reject);
			req.end('{"imagFreqCm1": 900}');
		});
		expect(answer.status).toBe(411);
		expect(JSON.parse(answer.body)).toEqual({
			error: { code: 'length_required', message: 'Send a Content-Length header with the body.' }
		});
	});
});

describe('API answers set no cookie', () => {
	it('drops the refreshed session cookie that a page with the same cookie gets', async () => {
		// The control: Auth.js refreshes the session cookie whenever the session is read.
		const page = await fetch(`${base}/account`, { headers: { cookie: contributor } });
		expect(page.headers.getSetCookie().some((c) => c.startsWith('authjs.session-token='))).toBe(
			true
		);
		const reads = [
			'/api/v1/potentials?limit=1',
			'/api/v1/facets',
			'/api/v1/submissions/999999',
			'/api/v1/nothing-here'
		];
		for (const path of reads) {
			const res = await fetch(`${base}${path}`, { headers: { cookie: contributor } });
			expect(res.headers.getSetCookie(), path).toEqual([]);
		}
		const write = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: { cookie: contributor, origin: base, 'content-type': 'application/json' },
			body: JSON.stringify({ imagFreqCm1: 900 })
		});
		expect(write.status).toBe(200);
		expect(write.headers.getSetCookie()).toEqual([]);
	});
});

describe('CORS over HTTP', () => {
	it('GET and HEAD from any origin: Access-Control-Allow-Origin *, never credentials', async () => {
		for (const method of ['GET', 'HEAD']) {
			const res = await fetch(`${base}/api/v1/potentials?limit=1`, {
				method,
				headers: { origin: 'https://notebook.example' }
			});
			expect(res.status).toBe(200);
			expect(res.headers.get('access-control-allow-origin')).toBe('*');
			expect(res.headers.get('access-control-allow-credentials')).toBeNull();
			expect(res.headers.get('access-control-expose-headers')).toContain('RateLimit-Remaining');
		}
		// Errors of reads too, so that a script on another origin can read what went wrong.
		const missing = await fetch(`${base}/api/v1/entries/HL999998`);
		expect(missing.headers.get('access-control-allow-origin')).toBe('*');
	});

	it('a preflight for GET with Authorization is granted; one for POST is not', async () => {
		const preflight = (method: string) =>
			fetch(`${base}/api/v1/potentials`, {
				method: 'OPTIONS',
				headers: {
					origin: 'https://notebook.example',
					'access-control-request-method': method,
					'access-control-request-headers': 'authorization'
				}
			});
		const get = await preflight('GET');
		expect(get.status).toBe(204);
		expect(get.headers.get('access-control-allow-origin')).toBe('*');
		expect(get.headers.get('access-control-allow-methods')).toBe('GET, HEAD');
		expect(get.headers.get('access-control-allow-headers')).toContain('Authorization');
		const post = await preflight('POST');
		expect(post.headers.get('access-control-allow-origin')).toBeNull();
		await expectApiError(post, 405, 'method_not_allowed');
	});
});

describe('in Chromium, from a page on another loopback origin', () => {
	let other: http.Server;
	let otherOrigin = '';
	let browser: Browser;
	let context: BrowserContext;
	let foreign: Page;
	let token = '';
	const marker = `Crossoriginase ${Date.now().toString(36)}`;

	beforeAll(async () => {
		other = http.createServer((_req, res) => {
			res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
			res.end('<!doctype html><title>another site</title><p>another site</p>');
		});
		await new Promise<void>((resolve) => other.listen(0, '127.0.0.1', resolve));
		otherOrigin = `http://127.0.0.1:${(other.address() as AddressInfo).port}`;
		token = await createTokenOnAccount(base, contributor, { name: 'cross-origin notebook' });
		browser = await launchChromium();
		context = await browser.newContext({ baseURL: base });
		// Signed in to the registry in this browser: its cookie is there for another site to try.
		const own = await context.newPage();
		await submitSignIn(own, 'contributor@demo.hopline.test', 'demo-contributor-pass');
		await own.getByTestId('user-menu').waitFor();
		foreign = await context.newPage();
		await foreign.goto(otherOrigin);
	}, 120_000);

	afterAll(async () => {
		await browser?.close();
		await new Promise((resolve) => other?.close(resolve));
	});

	/** Runs fetch in the foreign page; what the page's script can see of the answer. */
	function fetchThere(url: string, init: RequestInit, headers: string[] = []) {
		return foreign.evaluate(
			async ({ url, init, headers }) => {
				try {
					const res = await fetch(url, init);
					const seen: Record<string, string | null> = {};
					for (const h of headers) seen[h] = res.headers.get(h);
					return { ok: true as const, status: res.status, headers: seen, body: await res.text() };
				} catch (e) {
					return { ok: false as const, error: String(e) };
				}
			},
			{ url, init: init as Record<string, unknown>, headers }
		);
	}

	it('is another origin than the registry', () => {
		expect(new URL(otherOrigin).origin).not.toBe(new URL(base).origin);
		expect(foreign.url().startsWith(otherOrigin)).toBe(true);
	});

	it('reads public data, and the headers a client needs', async () => {
		const res = await fetchThere(`${base}/api/v1/potentials?limit=1&format=csv`, {}, [
			'x-total-count',
			'link',
			'content-type'
		]);
		expect(res).toMatchObject({ ok: true, status: 200 });
		if (!res.ok) return;
		expect(Number(res.headers['x-total-count'])).toBeGreaterThan(1);
		expect(res.headers.link).toMatch(/rel="next"/);
		expect(res.body.split('\r\n')[0]).toMatch(/^accession,/);
	});

	it('reads with a token after a preflight for Authorization, seeing its rate limit', async () => {
		const res = await fetchThere(
			`${base}/api/v1/facets`,
			{ headers: { authorization: `Bearer ${token}` } },
			['ratelimit-remaining', 'ratelimit-limit']
		);
		expect(res).toMatchObject({ ok: true, status: 200 });
		if (!res.ok) return;
		expect(Number(res.headers['ratelimit-limit'])).toBeGreaterThan(0);
		expect(res.headers['ratelimit-remaining']).not.toBeNull();
	});

	it('cannot read with the cookie session: the browser refuses a credentialed answer to *', async () => {
		const withCookie = await fetchThere(`${base}/api/v1/facets`, { credentials: 'include' });
		expect(withCookie).toMatchObject({
			ok: false,
			error: expect.stringContaining('Failed to fetch')
		});
		const withoutCookie = await fetchThere(`${base}/api/v1/facets`, {});
		expect(withoutCookie).toMatchObject({ ok: true, status: 200 });
	});

	it('cannot write with the cookie session, as JSON (no preflight) or as a form (refused)', async () => {
		const body = {
			kind: 'protein',
			data: { name: marker, organism: 'Crossoria testensis', structureIds: [], description: null }
		};
		const asJson = await fetchThere(`${base}/api/v1/submissions`, {
			method: 'POST',
			credentials: 'include',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(body)
		});
		expect(asJson).toMatchObject({ ok: false });
		const asForm = await fetchThere(`${base}/api/v1/submissions`, {
			method: 'POST',
			credentials: 'include',
			headers: { 'content-type': 'text/plain' },
			body: JSON.stringify(body)
		});
		expect(asForm).toMatchObject({ ok: false });
		const mine = async () =>
			(await fetch(`${base}/submissions`, { headers: { cookie: contributor } })).text();
		expect(await mine()).not.toContain(marker);

		// The control: the same request from the registry's own page goes through, and shows.
		const own = await context.newPage();
		await own.goto('/');
		const sameOrigin = await own.evaluate(
			async (b) =>
				(
					await fetch('/api/v1/submissions', {
						method: 'POST',
						headers: { 'content-type': 'application/json' },
						body: JSON.stringify(b)
					})
				).status,
			body
		);
		expect(sameOrigin).toBe(201);
		expect(await mine()).toContain(marker);
	});
});
