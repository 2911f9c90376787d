import { describe, expect, it } from 'vitest';
import { LIST_KEYS, potentialApiQuery, potentialPageQuery } from '$lib/schemas/catalogueQuery';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { searchHref } from '$lib/catalogue/searchUrl';
import { apiParamsForPage, exportParamsForPage } from '$lib/server/catalogue/searchRequests';
import { decodeCursor, encodeCursor } from '$lib/schemas/pagination';

const parse = (qs: string) =>
	parseSearchParams(potentialApiQuery, new URLSearchParams(qs), LIST_KEYS);

describe('catalogue query parameters', () => {
	it('accepts lists as repeats or commas', () => {
		const r = parse('kind=fe4s4&kind=heme_c,fmn&emMin=-400&emMax=-100');
		expect(r.ok && r.data.kind).toEqual(['fe4s4', 'heme_c', 'fmn']);
		expect(r.ok && r.data.emMin).toBe(-400);
	});
	it('names every bad field', () => {
		const r = parse('emMin=abc&kind=fe9&limit=0&colour=red');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(Object.keys(r.fields).sort()).toEqual(['colour', 'emMin', 'kind', 'limit']);
	});
	it('rejects reversed ranges', () => {
		const r = parse('phMin=9&phMax=7');
		expect(!r.ok && r.fields.phMin?.[0]).toMatch(/must not exceed phMax/);
	});
	it('rejects a scalar given twice', () => {
		const r = parse('emMin=1&emMax=3&emMin=2');
		expect(!r.ok && r.fields.emMin?.[0]).toMatch(/more than once/);
	});
	it('rejects cursors it did not issue', () => expect(parse('cursor=zzz').ok).toBe(false));
	it('ignores empty values, as an empty form field sends', () =>
		expect(parse('emMin=&q=').ok).toBe(true));
});

describe('search page URL state', () => {
	it('maps page and size onto limit and cursor', () => {
		const r = parseSearchParams(
			potentialPageQuery,
			new URLSearchParams('kind=fe4s4&page=3&size=50'),
			LIST_KEYS
		);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		const api = apiParamsForPage(r.data);
		expect(api.get('limit')).toBe('50');
		expect(decodeCursor(api.get('cursor') ?? '')).toEqual({ kind: 'offset', offset: 100 });
		expect(api.getAll('kind')).toEqual(['fe4s4']);
	});
	it('passes the page cursor to the API, and drops it when anything but the page changes', () => {
		const cursor = encodeCursor({
			list: 'potentials',
			sort: 'em',
			order: 'asc',
			direction: 'next',
			key: [-200],
			id: 12
		});
		const r = parseSearchParams(
			potentialPageQuery,
			new URLSearchParams(`kind=fe4s4&sort=em&cursor=${cursor}`),
			LIST_KEYS
		);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(apiParamsForPage(r.data).get('cursor')).toBe(cursor);
		expect(exportParamsForPage(r.data).toString()).toBe('kind=fe4s4&sort=em');
		const current = new URL(`http://x/search?kind=fe4s4&sort=em&cursor=${cursor}`);
		expect(searchHref(current, { order: 'desc' })).toBe('/search?kind=fe4s4&sort=em&order=desc');
		expect(searchHref(current, { cursor: 'def' })).toBe('/search?kind=fe4s4&sort=em&cursor=def');
		expect(searchHref(current, { hide: 'organism', cursor })).toBe(
			`/search?kind=fe4s4&sort=em&hide=organism&cursor=${cursor}`
		);
	});
	it('returns to page 1 when a filter changes', () => {
		const href = searchHref(new URL('http://x/search?q=rox&page=4'), { sort: 'em' });
		expect(href).toBe('/search?q=rox&sort=em');
	});
});
