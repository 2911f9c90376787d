import { createHash } from 'node:crypto';
import http from 'node:http';
import type { Socket } from 'node:net';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signInCookie } from '../support/session';

// HTTP hardening against the production build: security headers on every kind of response,
// connections closed after a refusal that leaves the body unread, and the cross-site check
// that answers the API in its JSON shape and lets cookie-less scripts through.
const base = inject('baseUrl');
const { hostname, port } = new URL(base);
let contributor = '';

beforeAll(async () => {
	contributor = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
});

interface Answer {
	status: number;
	headers: http.IncomingHttpHeaders;
	body: string;
	socket: Socket;
	reusedSocket: boolean;
}

/** One request through `agent` with node:http, bounded to 5 s (a stuck socket fails the test). */
function send(
	agent: http.Agent,
	options: { method: string; path: string; headers?: Record<string, string | number> },
	body?: Buffer | string
): Promise<Answer> {
	return new Promise((resolve, reject) => {
		const req = http.request(
			{ host: hostname, port, agent, ...options, headers: options.headers ?? {} },
			(res) => {
				let data = '';
				res.setEncoding('utf8');
				res.on('data', (d: string) => (data += d));
				res.on('end', () =>
					resolve({
						status: res.statusCode ?? 0,
						headers: res.headers,
						body: data,
						socket: req.socket as Socket,
						reusedSocket: req.reusedSocket
					})
				);
			}
		);
		req.setTimeout(5000, () => req.destroy(new Error(`no answer within 5 s: ${options.path}`)));
		req.on('error', reject);
		req.end(body);
	});
}

/** Resolves when the server has closed the socket, or rejects after 5 s. */
function closedByServer(socket: Socket): Promise<void> {
	if (socket.destroyed || socket.readableEnded) return Promise.resolve();
	return new Promise((resolve, reject) => {
		const timer = setTimeout(() => reject(new Error('the server kept the socket open')), 5000);
		const done = () => {
			clearTimeout(timer);
			resolve();
		};
		socket.once('end', done);
		socket.once('close', done);
	});
}

describe('an early 413 closes the connection (keep-alive socket, second request)', () => {
	const oversized: [string, string, Record<string, string>][] = [
		['JSON over BODY_MAX_BYTES', '/api/v1/calc/tunnelling', { 'content-type': 'application/json' }],
		[
			'an API upload over UPLOAD_MAX_BYTES',
			'/api/v1/uploads/check',
			{ 'content-type': 'multipart/form-data; boundary=x' }
		],
		[
			'the upload page over UPLOAD_MAX_BYTES',
			'/submissions/upload?/check',
			{ 'content-type': 'multipart/form-data; boundary=x', 'x-sveltekit-action': 'true' }
		]
	];
	for (const [what, path, headers] of oversized) {
		it(what, async () => {
			const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
			try {
				const size = path.includes('upload') ? 21 * 1024 * 1024 : 3 * 1024 * 1024;
				const first = await send(
					agent,
					{
						method: 'POST',
						path,
						headers: { ...headers, origin: base, cookie: contributor, 'content-length': size }
					},
					Buffer.alloc(size, 'x')
				);
				const status = path.includes('?/')
					? (JSON.parse(first.body) as { status: number }).status
					: first.status;
				expect(status).toBe(413);
				expect(first.headers.connection).toBe('close');
				await closedByServer(first.socket);
				const second = await send(agent, { method: 'GET', path: '/api/v1/facets' });
				expect(second.status).toBe(200);
				expect(second.reusedSocket).toBe(false);
			} finally {
				agent.destroy();
			}
		});
	}

	it('keeps the connection after a request whose body was read', async () => {
		const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
		try {
			const body = JSON.stringify({ imagFreqCm1: 900 });
			const first = await send(
				agent,
				{
					method: 'POST',
					path: '/api/v1/calc/tunnelling',
					headers: { 'content-type': 'application/json', 'content-length': body.length }
				},
				body
			);
			expect(first.status).toBe(200);
			expect(first.headers.connection).toBe('keep-alive');
			const second = await send(agent, { method: 'GET', path: '/api/v1/facets' });
			expect(second.status).toBe(200);
			expect(second.reusedSocket).toBe(true);
		} finally {
			agent.destroy();
		}
	});
});

describe('cross-site requests', () => {
	const csv = () => {
		const form = new FormData();
		form.set('kind', 'potential');
		form.set('file', new Blob(['centreAccession,couple,reportedValue\n']), 'f.csv');
		return form;
	};
	const check = (headers: Record<string, string>) =>
		fetch(`${base}/api/v1/uploads/check`, { method: 'POST', headers, body: csv() });

	it('lets a script without cookies or Origin reach the API (and its own 401)', async () => {
		const res = await check({});
		expect(res.status).toBe(401);
		expect(await res.json()).toEqual({
			error: { code: 'unauthorized', message: expect.any(String) }
		});
	});
	it('exempts Authorization: Bearer without a cookie, from any origin', async () => {
		const res = await check({ authorization: 'Bearer not-yet-a-token', origin: 'https://x.test' });
		expect(res.status).toBe(401);
	});
	it('refuses a cookie-carrying API post without Origin or from another site, in JSON', async () => {
		for (const origin of [null, 'https://attacker.test']) {
			const res = await check({ cookie: contributor, ...(origin ? { origin } : {}) });
			expect(res.status).toBe(403);
			const body = (await res.json()) as { error: { code: string; message: string } };
			expect(body.error.code).toBe('forbidden');
			expect(body.error.message).toContain(`Origin ${base}`);
		}
		const ok = await check({ cookie: contributor, origin: base });
		expect(ok.status).toBe(200);
	});
	it('still refuses cross-site form posts to pages, signed in or not', async () => {
		for (const cookie of [null, contributor]) {
			const res = await fetch(`${base}/signin`, {
				method: 'POST',
				headers: {
					origin: 'https://attacker.test',
					'content-type': 'application/x-www-form-urlencoded',
					...(cookie ? { cookie } : {})
				},
				body: 'email=a%40b.test&password=x',
				redirect: 'manual'
			});
			expect(res.status).toBe(403);
			expect(await res.text()).toBe('Cross-site POST form submissions are forbidden');
		}
	});
	it('lets JSON through without Origin (another site cannot send it without a preflight)', async () => {
		const res = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie: contributor },
			body: JSON.stringify({ imagFreqCm1: 900 })
		});
		expect(res.status).toBe(200);
	});
});

describe('security headers', () => {
	const common = (res: Response) => {
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
		expect(res.headers.get('x-frame-options')).toBe('DENY');
		expect(res.headers.get('cross-origin-opener-policy')).toBe('same-origin');
		expect(res.headers.get('permissions-policy')).toContain('camera=()');
		expect(res.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
	};
	it('pages: a policy with the hash of the inline script, and form-action', async () => {
		const a = await fetch(`${base}/`);
		common(a);
		const csp = a.headers.get('content-security-policy') ?? '';
		expect(csp).toMatch(/script-src 'self' 'sha256-[A-Za-z0-9+/=]+'/);
		expect(csp).not.toContain("'unsafe-inline'");
		expect(csp).toContain("object-src 'none'");
		expect(csp).toContain("style-src-attr 'unsafe-hashes' 'sha256-");
		expect(csp).toMatch(/form-action 'self'/);
		// Every inline script is allowed by its SHA-256 (CSP Level 3, "hash-source"), computed
		// here independently of SvelteKit; no nonce, since the same page goes to every reader.
		const html = await a.text();
		const inline = [...html.matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => m[1] ?? '');
		expect(inline.length).toBeGreaterThan(0);
		for (const script of inline)
			expect(csp).toContain(`'sha256-${createHash('sha256').update(script).digest('base64')}'`);
		expect(html).not.toContain('nonce=');
	});
	it('API JSON and CSV, API errors, redirects and 404s: nothing may load or frame them', async () => {
		const responses = await Promise.all([
			fetch(`${base}/api/v1/facets`),
			fetch(`${base}/api/v1/potentials?format=csv&limit=2`),
			fetch(`${base}/api/v1/nothing-here`),
			fetch(`${base}/submissions`, { redirect: 'manual' }),
			fetch(`${base}/csv/templates/potential.csv`)
		]);
		expect(responses.map((r) => r.status)).toEqual([200, 200, 404, 303, 200]);
		for (const res of responses) {
			common(res);
			expect(res.headers.get('content-security-policy')).toContain("default-src 'none'");
		}
	});
	it('refusals too: a 413 and a cross-site 403', async () => {
		const big = await fetch(`${base}/api/v1/calc/tunnelling`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: 'x'.repeat(3 * 1024 * 1024)
		});
		expect(big.status).toBe(413);
		common(big);
		const forged = await fetch(`${base}/signin`, {
			method: 'POST',
			headers: { origin: 'https://attacker.test', 'content-type': 'text/plain' },
			body: 'x'
		});
		expect(forged.status).toBe(403);
		common(forged);
	});
});
