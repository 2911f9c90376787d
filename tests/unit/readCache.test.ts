import { describe, expect, it } from 'vitest';
import { hasSessionCookie } from '$lib/server/auth/sessionCookie';
import { nextUtcMidnight } from '$lib/server/catalogue/validity';
import { createReadCache, etagMatches, isSignedOutRead } from '$lib/server/http/readCache';

const event = (
	routeId: string | null,
	init: { method?: string; headers?: Record<string, string> } = {}
) => ({ request: new Request('http://hopline.test/x', init), route: { id: routeId } });

describe('which reads are kept for signed-out readers', () => {
	it('keeps GETs of catalogue routes without credentials', () => {
		expect(isSignedOutRead(event('/e/[accession=accession]/[[version=version]]'))).toBe(true);
		expect(isSignedOutRead(event('/api/v1/potentials'))).toBe(true);
		// Cookies other than the session (Auth.js's callback URL, say) do not make a reader.
		const other = { headers: { cookie: 'authjs.callback-url=x; theme=dark' } };
		expect(isSignedOutRead(event('/search', other))).toBe(true);
	});

	it('never keeps writes, other routes, sessions or Authorization headers', () => {
		expect(isSignedOutRead(event('/search', { method: 'POST' }))).toBe(false);
		expect(isSignedOutRead(event('/submissions'))).toBe(false);
		expect(isSignedOutRead(event('/account'))).toBe(false);
		expect(isSignedOutRead(event(null))).toBe(false);
		for (const cookie of [
			'authjs.session-token=abc',
			'a=1; __Secure-authjs.session-token=abc',
			'authjs.session-token.0=abc; authjs.session-token.1=def'
		]) {
			expect(isSignedOutRead(event('/search', { headers: { cookie } }))).toBe(false);
			expect(hasSessionCookie(new Request('http://h/', { headers: { cookie } }))).toBe(true);
		}
		const bearer = { headers: { authorization: 'Bearer t' } };
		expect(isSignedOutRead(event('/api/v1/potentials', bearer))).toBe(false);
	});
});

describe('If-None-Match (RFC 9110 §13.1.2, weak comparison)', () => {
	it('matches one tag, a list, weak forms and *', () => {
		expect(etagMatches('"abc"', '"abc"')).toBe(true);
		expect(etagMatches('"x", "abc"', '"abc"')).toBe(true);
		expect(etagMatches('W/"abc"', '"abc"')).toBe(true);
		expect(etagMatches('*', '"abc"')).toBe(true);
		expect(etagMatches('"abd"', '"abc"')).toBe(false);
		expect(etagMatches(null, '"abc"')).toBe(false);
		expect(etagMatches('', '"abc"')).toBe(false);
	});
});

describe('the next UTC midnight (citations carry the access date)', () => {
	it('is the start of the next UTC day, across month and year ends', () => {
		expect(new Date(nextUtcMidnight(new Date('2026-12-02T15:00:00Z'))).toISOString()).toBe(
			'2026-12-03T00:00:00.000Z'
		);
		expect(new Date(nextUtcMidnight(new Date('2026-12-31T23:59:59.999Z'))).toISOString()).toBe(
			'2027-01-01T00:00:00.000Z'
		);
		expect(new Date(nextUtcMidnight(new Date('2027-01-01T00:00:00.000Z'))).toISOString()).toBe(
			'2027-01-02T00:00:00.000Z'
		);
	});
});

describe('the read cache', () => {
	function setup(maxEntryBytes = 10_000) {
		let validity = { revision: 1, validUntil: Date.now() + 60_000 };
		const cache = createReadCache({
			validity: async () => validity,
			maxBytes: 100_000,
			maxEntryBytes
		});
		let renders = 0;
		let answer = (): Response => new Response(`page ${renders}`, { status: 200 });
		const resolve = async () => {
			renders++;
			await new Promise((r) => setTimeout(r, 5));
			return answer();
		};
		const request = (
			path = '/search?kind=fe4s4',
			headers: Record<string, string> = {},
			routeId = '/search'
		) => {
			const url = new URL(`http://hopline.test${path}`);
			const event = { url, request: new Request(url, { headers }), route: { id: routeId } };
			return cache.handle({ event: event as never, resolve: resolve as never });
		};
		return {
			request,
			renders: () => renders,
			setValidity: (v: typeof validity) => (validity = v),
			setAnswer: (f: () => Response) => (answer = f),
			stats: cache.stats
		};
	}

	it('renders once per URL and revision, however many readers ask at once', async () => {
		const c = setup();
		const bodies = await Promise.all(
			Array.from({ length: 20 }, async () => (await c.request()).text())
		);
		expect(new Set(bodies)).toEqual(new Set(['page 1']));
		expect(c.renders()).toBe(1);
		await c.request('/search?kind=heme_c');
		expect(c.renders()).toBe(2);
		c.setValidity({ revision: 2, validUntil: Date.now() + 60_000 });
		expect(await (await c.request()).text()).toBe('page 3');
		expect(c.stats().hits).toBe(19);
	});

	it('keeps one copy of a route that reads no query, whatever query strings strangers add', async () => {
		const c = setup();
		for (const n of [1, 2, 3]) await c.request(`/api?n=${n}`, {}, '/api');
		await c.request('/api', {}, '/api');
		expect(c.renders()).toBe(1);
		// A route that reads its query keeps a copy per query.
		await c.request('/search?q=a');
		await c.request('/search?q=b');
		expect(c.renders()).toBe(3);
	});

	it('renders again once the validity has run out (an embargo ended)', async () => {
		const c = setup();
		c.setValidity({ revision: 1, validUntil: Date.now() + 30 });
		await c.request();
		await c.request();
		expect(c.renders()).toBe(1);
		await new Promise((r) => setTimeout(r, 40));
		c.setValidity({ revision: 1, validUntil: Date.now() + 60_000 });
		await c.request();
		expect(c.renders()).toBe(2);
	});

	it('keeps nothing marked no-store or private, setting a cookie, or not 200', async () => {
		for (const make of [
			() => new Response('busy', { headers: { 'cache-control': 'no-store' } }),
			() => new Response('mine', { headers: { 'cache-control': 'private' } }),
			() => new Response('c', { headers: { 'set-cookie': 'a=b' } }),
			() => new Response('gone', { status: 404 })
		]) {
			const c = setup(100);
			c.setAnswer(make);
			await Promise.all([c.request(), c.request()]);
			await c.request();
			expect(c.renders()).toBe(3);
		}
	});

	it('does not keep an answer over the per-entry limit (readers waiting on it share it)', async () => {
		const c = setup(100);
		c.setAnswer(() => new Response('x'.repeat(200)));
		await Promise.all([c.request(), c.request()]);
		expect(c.renders()).toBe(1);
		await c.request();
		expect(c.renders()).toBe(2);
		expect(c.stats().entries).toBe(0);
	});

	it('answers 304 to a matching If-None-Match, with the ETag', async () => {
		const c = setup();
		const first = await c.request();
		const etag = first.headers.get('etag') as string;
		expect(etag).toMatch(/^"[\w-]+"$/);
		const again = await c.request('/search?kind=fe4s4', { 'if-none-match': `W/${etag}` });
		expect(again.status).toBe(304);
		expect(again.headers.get('etag')).toBe(etag);
		expect(await again.text()).toBe('');
	});
});
