import { hopRateQuerySchema } from '$lib/schemas/calc';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, computedJson, parseApiQuery } from '$lib/server/api/respond';
import { hopRateAnswer } from '$lib/server/calc/answers';
import type { RequestHandler } from './$types';

/** GET /api/v1/calc/hop-rate?distance=&dG=&lambda=&model=&temperature=&packing= */
export const GET: RequestHandler = apiHandler(async ({ url }) => {
	const query = parseApiQuery(url, hopRateQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	return computedJson(hopRateAnswer(query.data));
});
