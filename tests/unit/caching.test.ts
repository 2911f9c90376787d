import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { Viewer } from '$lib/server/catalogue/visibility';
import {
	IMMUTABLE_CACHE_CONTROL,
	cachePolicy,
	createCachingHandle,
	listEtag,
	visibilityClass
} from '$lib/server/http/caching';
import { addVary } from '$lib/server/http/readCache';

// The rules are RFC 9111 (Cache-Control: public/private, no-cache, max-age, and RFC 8246's
// immutable) and RFC 9110 §13.1.2 (If-None-Match → 304 for GET); which answers are frozen is
// the registry's promise (DESIGN.md, "Frozen").

const ENTRY_PAGE = '/e/[accession=accession]/[[version=version]]';

function setup() {
	let validity = { revision: 1, validUntil: 2_000_000_000_000 };
	let renders = 0;
	let answer = (): Response =>
		Response.json({ n: renders }, { headers: { 'set-cookie': 'authjs.session-token=x' } });
	const handle = createCachingHandle({ validity: async () => validity, build: 'b1' });
	const request = (
		path: string,
		route: string,
		options: {
			headers?: Record<string, string>;
			params?: Record<string, string>;
			viewer?: Viewer | null;
			method?: string;
		} = {}
	) => {
		const url = new URL(`http://hopline.test${path}`);
		const event = {
			url,
			request: new Request(url, { headers: options.headers, method: options.method }),
			route: { id: route },
			params: options.params ?? {},
			locals: { viewer: options.viewer ?? null }
		};
		return handle({
			event: event as never,
			resolve: (async () => {
				renders++;
				return answer();
			}) as never
		});
	};
	return {
		request,
		renders: () => renders,
		setValidity: (v: typeof validity) => (validity = v),
		setAnswer: (f: () => Response) => (answer = f)
	};
}

describe('which answers are immutable, lists, or neither', () => {
	it('API versions are immutable, entry pages and the latest version are not, lists are lists', () => {
		const at = (route: string, path: string, params: Record<string, string> = {}) =>
			cachePolicy({ route: { id: route }, params, url: new URL(`http://h${path}`) } as never);
		// A version page also shows the current registry beneath the frozen version: revalidated.
		expect(at(ENTRY_PAGE, '/e/HL000001/v2', { accession: 'HL000001', version: 'v2' })).toBeNull();
		expect(at(ENTRY_PAGE, '/e/HL000001', { accession: 'HL000001' })).toBeNull();
		expect(at('/api/v1/entries/[accession=accession]', '/api/v1/entries/HL000001?version=2')).toBe(
			'immutable'
		);
		expect(at('/api/v1/entries/[accession=accession]', '/api/v1/entries/HL000001')).toBeNull();
		for (const list of ['potentials', 'proteins', 'centres', 'distances', 'spin-records', 'facets'])
			expect(at(`/api/v1/${list}`, `/api/v1/${list}`)).toBe('list');
		expect(at('/api/v1/potentials/export', '/api/v1/potentials/export')).toBe('list');
		expect(at('/search', '/search')).toBeNull();
	});
	it('readers of the same groups share a class; no groups is the public class', () => {
		expect(visibilityClass(null)).toBe('public');
		expect(visibilityClass({ groupIds: [] })).toBe('public');
		expect(visibilityClass({ groupIds: [3, 1, 3] })).toBe(visibilityClass({ groupIds: [1, 3] }));
		expect(visibilityClass({ groupIds: [1] })).not.toBe(visibilityClass({ groupIds: [1, 3] }));
	});
	it('names each Vary token once', () => {
		const headers = new Headers({ vary: 'Accept-Encoding, cookie' });
		addVary(headers, ['Cookie', 'Authorization']);
		addVary(headers, ['Authorization', 'Accept-Encoding']);
		expect(headers.get('vary')).toBe('Accept-Encoding, cookie, Authorization');
	});
});

describe('list ETags from the revision, the query and the reader', () => {
	const request = (url: string, accept = 'application/json') =>
		new Request(url, { headers: { accept } });
	const v = { revision: 7, validUntil: 1000 };
	const base = listEtag(request('http://h/api/v1/potentials?kind=fe4s4'), v, 'b', null);
	it('changes with each thing the answer depends on, and only with those', () => {
		expect(listEtag(request('http://h/api/v1/potentials?kind=fe4s4'), v, 'b', null)).toBe(base);
		for (const other of [
			listEtag(request('http://h/api/v1/potentials?kind=fmn'), v, 'b', null),
			listEtag(request('http://h/api/v1/potentials?kind=fe4s4', 'text/csv'), v, 'b', null),
			listEtag(request('http://h/api/v1/potentials?kind=fe4s4'), { ...v, revision: 8 }, 'b', null),
			listEtag(
				request('http://h/api/v1/potentials?kind=fe4s4'),
				{ ...v, validUntil: 2 },
				'b',
				null
			),
			listEtag(request('http://h/api/v1/potentials?kind=fe4s4'), v, 'c', null),
			listEtag(request('http://h/api/v1/potentials?kind=fe4s4'), v, 'b', { groupIds: [2] })
		])
			expect(other).not.toBe(base);
		expect(base).toMatch(/^"[^"]+"$/);
	});

	it('answers a matching If-None-Match with 304 before any work, until the revision moves', async () => {
		const c = setup();
		const first = await c.request('/api/v1/potentials?kind=fe4s4', '/api/v1/potentials');
		const etag = first.headers.get('etag')!;
		expect(first.status).toBe(200);
		expect(first.headers.get('cache-control')).toBe('public, no-cache');
		expect(first.headers.get('vary')).toBe('Cookie, Authorization');
		expect(first.headers.get('set-cookie')).toBeNull();
		const again = await c.request('/api/v1/potentials?kind=fe4s4', '/api/v1/potentials', {
			headers: { 'if-none-match': etag }
		});
		expect(again.status).toBe(304);
		expect(again.headers.get('etag')).toBe(etag);
		expect(c.renders()).toBe(1);
		// The read cache sends compressed copies tagged "…-br": still the same answer.
		const compressed = await c.request('/api/v1/potentials?kind=fe4s4', '/api/v1/potentials', {
			headers: { 'if-none-match': etag.replace(/"$/, '-br"') }
		});
		expect(compressed.status).toBe(304);
		expect(c.renders()).toBe(1);
		c.setValidity({ revision: 2, validUntil: 2_000_000_000_000 });
		const moved = await c.request('/api/v1/potentials?kind=fe4s4', '/api/v1/potentials', {
			headers: { 'if-none-match': etag }
		});
		expect(moved.status).toBe(200);
		expect(moved.headers.get('etag')).not.toBe(etag);
		expect(c.renders()).toBe(2);
	});

	it('marks a signed-in or token-bearing reader’s list private, tagged by their groups', async () => {
		const c = setup();
		const member = await c.request('/api/v1/facets', '/api/v1/facets', {
			headers: { authorization: 'Bearer hl_x' },
			viewer: { groupIds: [4] }
		});
		expect(member.headers.get('cache-control')).toBe('private, no-cache');
		const outsider = await c.request('/api/v1/facets', '/api/v1/facets');
		expect(outsider.headers.get('etag')).not.toBe(member.headers.get('etag'));
		const notModified = await c.request('/api/v1/facets', '/api/v1/facets', {
			headers: { authorization: 'Bearer hl_x', 'if-none-match': member.headers.get('etag')! },
			viewer: { groupIds: [4] }
		});
		expect(notModified.status).toBe(304);
		expect(notModified.headers.get('cache-control')).toBe('private, no-cache');
		// Another group's tag is no match.
		const other = await c.request('/api/v1/facets', '/api/v1/facets', {
			headers: { authorization: 'Bearer hl_y', 'if-none-match': member.headers.get('etag')! },
			viewer: { groupIds: [5] }
		});
		expect(other.status).toBe(200);
	});

	it('leaves errors untagged', async () => {
		const c = setup();
		c.setAnswer(() => Response.json({ error: {} }, { status: 400 }));
		const bad = await c.request('/api/v1/potentials?emMin=x', '/api/v1/potentials');
		expect(bad.status).toBe(400);
		expect(bad.headers.get('etag')).toBeNull();
	});
});

describe('versions: immutable for everyone when public, private otherwise', () => {
	const page = (c: ReturnType<typeof setup>, headers: Record<string, string> = {}) =>
		c.request('/api/v1/entries/HL000001?version=1', '/api/v1/entries/[accession=accession]', {
			headers,
			params: { accession: 'HL000001' }
		});

	it('gives a signed-out reader a strong ETag of the bytes and a year, immutable', async () => {
		const c = setup();
		c.setAnswer(() => new Response('<h1>v1</h1>', { headers: { etag: '"weak-djb2"' } }));
		const res = await page(c);
		const sha = createHash('sha256').update('<h1>v1</h1>').digest('base64url');
		expect(res.headers.get('etag')).toBe(`"${sha}"`);
		expect(res.headers.get('cache-control')).toBe(IMMUTABLE_CACHE_CONTROL);
		expect(res.headers.get('vary')).toBe('Cookie, Authorization');
		expect(await res.text()).toBe('<h1>v1</h1>');
		const again = await page(c, { 'if-none-match': `"${sha}"` });
		expect(again.status).toBe(304);
		expect(again.headers.get('cache-control')).toBe(IMMUTABLE_CACHE_CONTROL);
	});

	it('keeps a signed-in reader’s copy private and revalidated; 404s are not tagged', async () => {
		const c = setup();
		c.setAnswer(() => new Response('<h1>v1</h1>'));
		const res = await page(c, { cookie: 'authjs.session-token=abc' });
		expect(res.headers.get('cache-control')).toBe('private, no-cache');
		expect(res.headers.get('vary')).toBe('Cookie, Authorization');
		const api = await c.request(
			'/api/v1/entries/HL000001?version=1',
			'/api/v1/entries/[accession=accession]',
			{
				headers: { authorization: 'Bearer hl_x' }
			}
		);
		expect(api.headers.get('cache-control')).toBe('private, no-cache');
		expect(api.headers.get('set-cookie')).toBeNull();
		c.setAnswer(() => new Response('gone', { status: 404 }));
		const missing = await page(c);
		expect(missing.headers.get('cache-control')).toBeNull();
		expect(missing.headers.get('etag')).toBeNull();
	});

	it('keeps a signed-in reader’s entry page private and revalidated, a signed-out one’s untouched', async () => {
		const c = setup();
		c.setAnswer(() => new Response('<h1>v1</h1>'));
		const entryPage = (headers: Record<string, string>) =>
			c.request('/e/HL000001/v1', ENTRY_PAGE, {
				headers,
				params: { accession: 'HL000001', version: 'v1' }
			});
		const mine = await entryPage({ cookie: 'authjs.session-token=abc' });
		expect(mine.headers.get('cache-control')).toBe('private, no-cache');
		expect(mine.headers.get('vary')).toBe('Cookie, Authorization');
		const anyone = await entryPage({});
		expect(anyone.headers.get('cache-control')).toBeNull();
		expect(anyone.headers.get('etag')).toBeNull();
	});

	it('leaves a version answer that says no-store (a note true only now) untagged and not immutable', async () => {
		const c = setup();
		c.setAnswer(
			() =>
				new Response('<h1>v1</h1><p>busy, reload</p>', {
					headers: { 'cache-control': 'no-store' }
				})
		);
		const res = await page(c);
		expect(res.headers.get('cache-control')).toBe('no-store');
		expect(res.headers.get('etag')).toBeNull();
	});

	it('keeps the cookies of pages, strips them from API answers', async () => {
		const c = setup();
		const pageAnswer = await c.request('/account', '/account');
		expect(pageAnswer.headers.get('set-cookie')).not.toBeNull();
		const api = await c.request('/api/v1', '/api/v1');
		expect(api.headers.get('set-cookie')).toBeNull();
	});
});
