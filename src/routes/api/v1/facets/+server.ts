import { facetsApiQuery } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, parseApiQuery } from '$lib/server/api/respond';
import { catalogueFacets } from '$lib/server/catalogue/facets';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/facets — counts of potentials per cofactor kind, organism and method within the
 * search the filters describe (each facet without its own filter), and totals.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, facetsApiQuery);
	if (!query.ok) return badQuery(query.fields);
	return Response.json(await catalogueFacets(db, locals.viewer, query.data));
});
