import { SPIN_RECORD_CSV } from '$lib/catalogue/csvRows';
import { spinRecordApiQuerySchema } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, cursorOf, parseApiQuery, respondWithPage } from '$lib/server/api/respond';
import { listSpinRecords } from '$lib/server/kinds/spinRecord';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/spin-records — spin states and g-values per oxidation level. */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, spinRecordApiQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, limit, cursor, format, ...filter } = query.data;
	const page = await listSpinRecords(
		db,
		filter,
		{ sort, order, limit, cursor: cursorOf(cursor) },
		locals.viewer
	);
	return respondWithPage(url, page, format, SPIN_RECORD_CSV, 'spin-records');
});
