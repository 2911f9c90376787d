import { FILTER_KEYS } from '$lib/catalogue/searchUrl';
import type { PotentialPageQuery } from '$lib/schemas/catalogueQuery';
import { encodeOffsetCursor } from '$lib/schemas/pagination';

/*
 * The read-API requests that answer a search page's URL state: the page's rows, every matching
 * row as CSV, and the facet counts. Built on the server, where the page's query is parsed.
 */

/** The API query that returns exactly the rows the search page shows. */
export function apiParamsForPage(query: PotentialPageQuery): URLSearchParams {
	const params = new URLSearchParams();
	for (const key of FILTER_KEYS) {
		const value = query[key];
		if (value === undefined) continue;
		if (Array.isArray(value)) for (const v of value) params.append(key, v);
		else params.set(key, String(value));
	}
	if (query.sort) params.set('sort', query.sort);
	if (query.order) params.set('order', query.order);
	params.set('limit', String(query.size));
	if (query.cursor) params.set('cursor', query.cursor);
	else if (query.page > 1) params.set('cursor', encodeOffsetCursor((query.page - 1) * query.size));
	return params;
}

/** The API query for exporting every row the search page matches, in its order. */
export function exportParamsForPage(query: PotentialPageQuery): URLSearchParams {
	const params = apiParamsForPage(query);
	params.delete('limit');
	params.delete('cursor');
	return params;
}

/** The API query for the facet counts of what the search page matches: its filters only. */
export function facetParamsForPage(query: PotentialPageQuery): URLSearchParams {
	const params = exportParamsForPage(query);
	params.delete('sort');
	params.delete('order');
	return params;
}
