import type { ParamMatcher } from '@sveltejs/kit';

/**
 * The extension of a citation file (cite.bib, cite.ris, cite.json). Written out rather than
 * read from the table of formats in $lib/catalogue/citation, which the router every page loads
 * should not carry; params.test.ts checks the two agree.
 */
export const match = ((param): param is 'bib' | 'ris' | 'json' =>
	param === 'bib' || param === 'ris' || param === 'json') satisfies ParamMatcher;
