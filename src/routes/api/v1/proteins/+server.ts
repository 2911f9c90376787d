import { PROTEIN_CSV } from '$lib/catalogue/csvRows';
import { proteinApiQuerySchema } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, cursorOf, parseApiQuery, respondWithPage } from '$lib/server/api/respond';
import { listProteins } from '$lib/server/kinds/protein';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/proteins — proteins and complexes, by text and organism. */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, proteinApiQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, limit, cursor, format, ...filter } = query.data;
	const page = await listProteins(
		db,
		filter,
		{ sort, order, limit, cursor: cursorOf(cursor) },
		locals.viewer
	);
	return respondWithPage(url, page, format, PROTEIN_CSV, 'proteins');
});
