/*
 * The lists of the search table: sort keys (the API's too), columns, page sizes. Plain data, no
 * schema library, so that the page's browser code reads them without loading zod; the query schemas
 * (src/lib/schemas/catalogueQuery.ts) build their enums from these same lists.
 */

/** Orders the potentials list (the API's `sort` and the page's column headers). */
export const POTENTIAL_SORTS = [
	'relevance',
	'accession',
	'protein',
	'centre',
	'kind',
	'couple',
	'em',
	'ph',
	'temperature',
	'method'
] as const;
export type PotentialSort = (typeof POTENTIAL_SORTS)[number];

/** Columns of the search table that a reader can hide (kept in the URL as `hide`). */
export const POTENTIAL_COLUMNS = [
	'accession',
	'protein',
	'organism',
	'centre',
	'kind',
	'couple',
	'em',
	'reported',
	'ph',
	'temperature',
	'method',
	'source'
] as const;
export type PotentialColumn = (typeof POTENTIAL_COLUMNS)[number];

/**
 * Columns hidden while the URL names none: the organism (in the protein's tooltip and the phone
 * cards) and the value as reported, so that every other column fits at 1366 px. `hide=none`
 * shows them all.
 */
export const DEFAULT_HIDDEN_COLUMNS: readonly PotentialColumn[] = ['organism', 'reported'];

/** The columns a page query hides. */
export function hiddenColumns(hide: readonly (PotentialColumn | 'none')[] | undefined) {
	return hide === undefined
		? DEFAULT_HIDDEN_COLUMNS
		: hide.filter((c): c is PotentialColumn => c !== 'none');
}

/** Rows per page the search page offers (25 unless the URL says otherwise). */
export const PAGE_SIZES = [25, 50, 100] as const;
