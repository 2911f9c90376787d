/*
 * The related lists of an entry page (centres, potentials, …), how long a page of each is, and
 * the link to another page of one: apart from the query's schema (relatedPages.ts), so that the
 * entry page, which links them, loads no schema library. Lists on entry pages are paged, never
 * sent whole: a centre may hold thousands of values.
 */
export const RELATED_PAGE_SIZE = 50;
export const RELATED_LISTS = ['centres', 'potentials', 'spinRecords', 'distances'] as const;
export type RelatedList = (typeof RELATED_LISTS)[number];

/** The link to page `n` of one list, keeping the other lists' pages; jumps to the list. */
export function relatedPageHref(url: URL, list: RelatedList, n: number): string {
	const params = new URLSearchParams(url.search);
	if (n === 1) params.delete(list);
	else params.set(list, String(n));
	const query = params.toString();
	return `${url.pathname}${query ? `?${query}` : ''}#${list}-heading`;
}
