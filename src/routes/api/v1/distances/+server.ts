import { DISTANCE_CSV } from '$lib/catalogue/csvRows';
import { distanceApiQuery } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, cursorOf, parseApiQuery, respondWithPage } from '$lib/server/api/respond';
import { listDistances } from '$lib/server/kinds/distance';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/distances — edge-to-edge and centre-to-centre distances between centres. */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, distanceApiQuery);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, limit, cursor, format, ...filter } = query.data;
	const page = await listDistances(
		db,
		filter,
		{ sort, order, limit, cursor: cursorOf(cursor) },
		locals.viewer
	);
	return respondWithPage(url, page, format, DISTANCE_CSV, 'distances');
});
