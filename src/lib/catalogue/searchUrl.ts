/*
 * The search page's URL state in the browser: new page URLs. (The API requests that answer a
 * page's URL are built on the server: src/lib/server/catalogue/searchRequests.ts.)
 */

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
