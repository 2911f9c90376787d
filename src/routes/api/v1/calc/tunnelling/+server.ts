import { tunnellingRequestSchema } from '$lib/schemas/calc';
import { parseJsonBody } from '$lib/server/api/body';
import { apiHandler } from '$lib/server/api/handler';
import { computedJson } from '$lib/server/api/respond';
import { tunnellingAnswer } from '$lib/server/calc/answers';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import type { RequestHandler } from './$types';

/** POST /api/v1/calc/tunnelling — tunnelling factors and/or vibrational levels of a potential. */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = callerOf(event);
	checkCaller(caller);
	const body = await parseJsonBody(event.request, tunnellingRequestSchema);
	if (!body.ok) return body.response;
	const result = await calculate({ kind: 'tunnelling', request: body.data }, caller);
	return computedJson(tunnellingAnswer(result));
});
