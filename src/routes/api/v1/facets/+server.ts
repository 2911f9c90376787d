import { apiHandler } from '$lib/server/api/handler';
import { catalogueFacets } from '$lib/server/catalogue/facets';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/facets — counts of potentials per cofactor kind, organism and method. */
export const GET: RequestHandler = apiHandler(async ({ locals }) =>
	Response.json(await catalogueFacets(db, locals.viewer))
);
