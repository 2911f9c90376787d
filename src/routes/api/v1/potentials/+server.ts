import { POTENTIAL_CSV } from '$lib/catalogue/csvRows';
import { potentialApiQuery } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, cursorOf, parseApiQuery, respondWithPage } from '$lib/server/api/respond';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/potentials — midpoint potentials with the catalogue's filters. */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, potentialApiQuery);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, limit, cursor, format, ...filter } = query.data;
	const page = await listPotentials(
		db,
		filter,
		{ sort, order, limit, cursor: cursorOf(cursor) },
		locals.viewer
	);
	return respondWithPage(url, page, format, POTENTIAL_CSV, 'potentials');
});
