import type { PotentialPageQuery } from '$lib/schemas/catalogueQuery';
import { encodeOffsetCursor } from '$lib/schemas/pagination';

/* Translating the search page's URL state into API requests and new page URLs. */

/** The parameters that choose which rows the search shows (not their order, page or columns). */
export const FILTER_KEYS = [
	'q',
	'kind',
	'organism',
	'method',
	'emMin',
	'emMax',
	'phMin',
	'phMax',
	'tMin',
	'tMax',
	'protein',
	'centre'
] as const;

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

export type ParamChange = string | number | readonly string[] | null | undefined;

/**
 * The current search URL with some parameters replaced (null or empty removes them). Any
 * change other than paging (`cursor`) returns to the first page: a cursor belongs to its sort.
 */
export function searchHref(current: URL, changes: Record<string, ParamChange>): string {
	const next = new URLSearchParams(current.searchParams);
	for (const [key, value] of Object.entries(changes)) {
		next.delete(key);
		if (value === null || value === undefined || value === '') continue;
		if (Array.isArray(value)) for (const v of value) next.append(key, v);
		else next.set(key, String(value));
	}
	if (!('page' in changes)) next.delete('page');
	if (!('cursor' in changes)) next.delete('cursor');
	const search = next.toString();
	return `${current.pathname}${search ? `?${search}` : ''}`;
}
