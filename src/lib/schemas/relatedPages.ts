import { z } from 'zod';
import { fieldErrors } from './fieldErrors';

/*
 * Which page of each related list an entry page shows (`?potentials=3`). Lists on entry pages
 * are paged, never sent whole: a centre may hold thousands of values.
 */
export const RELATED_PAGE_SIZE = 50;
export const RELATED_LISTS = ['centres', 'potentials', 'spinRecords', 'distances'] as const;
export type RelatedList = (typeof RELATED_LISTS)[number];

const pageNumber = z.coerce
	.number({ error: 'expected a page number' })
	.int('expected a whole page number')
	.min(1, 'pages start at 1')
	.max(1_000_000, 'at most page 1 000 000')
	.default(1);

export const relatedPagesSchema = z.object({
	centres: pageNumber,
	potentials: pageNumber,
	spinRecords: pageNumber,
	distances: pageNumber
});
export type RelatedPages = z.infer<typeof relatedPagesSchema>;

/** The page numbers in a URL's query; unrelated parameters are ignored, bad numbers named. */
export function parseRelatedPages(
	params: URLSearchParams
): { ok: true; pages: RelatedPages } | { ok: false; fields: Record<string, string[]> } {
	const raw: Record<string, string> = {};
	for (const list of RELATED_LISTS) {
		const v = params.get(list);
		if (v !== null) raw[list] = v;
	}
	const parsed = relatedPagesSchema.safeParse(raw);
	if (parsed.success) return { ok: true, pages: parsed.data };
	return { ok: false, fields: fieldErrors(parsed.error) };
}

/** The link to page `n` of one list, keeping the other lists' pages; jumps to the list. */
export function relatedPageHref(url: URL, list: RelatedList, n: number): string {
	const params = new URLSearchParams(url.search);
	if (n === 1) params.delete(list);
	else params.set(list, String(n));
	const query = params.toString();
	return `${url.pathname}${query ? `?${query}` : ''}#${list}-heading`;
}
