import { describe, expect, it } from 'vitest';
import { relatedPageHref } from '$lib/schemas/relatedLists';
import { parseRelatedPages } from '$lib/schemas/relatedPages';

describe('pages of the related lists on entry pages', () => {
	it('default to page 1 and ignore unrelated parameters', () => {
		const r = parseRelatedPages(new URLSearchParams('q=x&potentials=3'));
		expect(r).toEqual({
			ok: true,
			pages: { centres: 1, potentials: 3, spinRecords: 1, distances: 1 }
		});
	});
	it('name each bad page number', () => {
		const r = parseRelatedPages(new URLSearchParams('potentials=0&distances=abc&centres=2.5'));
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.fields.potentials).toEqual(['pages start at 1']);
		expect(r.fields.distances).toEqual(['expected a page number']);
		expect(r.fields.centres).toEqual(['expected a whole page number']);
	});
	it('link to another page of one list, keeping the others', () => {
		const url = new URL('http://x.test/e/HL000008?centres=2&potentials=4');
		expect(relatedPageHref(url, 'potentials', 5)).toBe(
			'/e/HL000008?centres=2&potentials=5#potentials-heading'
		);
		expect(relatedPageHref(url, 'centres', 1)).toBe('/e/HL000008?potentials=4#centres-heading');
	});
});
