import { CENTRE_CSV } from '$lib/catalogue/csvRows';
import { centreApiQuerySchema } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, cursorOf, parseApiQuery, respondWithPage } from '$lib/server/api/respond';
import { listCentres } from '$lib/server/kinds/centre';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/centres — redox centres, by text, cofactor kind, organism and protein. */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, centreApiQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, limit, cursor, format, ...filter } = query.data;
	const page = await listCentres(
		db,
		filter,
		{ sort, order, limit, cursor: cursorOf(cursor) },
		locals.viewer
	);
	return respondWithPage(url, page, format, CENTRE_CSV, 'centres');
});
