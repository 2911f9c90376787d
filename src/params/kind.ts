import type { ParamMatcher } from '@sveltejs/kit';

/**
 * The shape of an entry kind identifier (e.g. spin_record). Only the shape: matchers run in the
 * router every page loads, and the table of kinds (with its schemas) should not ship with it, so
 * the route checks the identifier names a kind (`isEntryKind`) and answers 404 otherwise.
 */
export const match = ((param): param is string =>
	/^[a-z][a-z_]{0,39}$/.test(param)) satisfies ParamMatcher;
