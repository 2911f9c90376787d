import { titrationRequestSchema } from '$lib/schemas/calc';
import { parseJsonBody } from '$lib/server/api/body';
import { apiHandler } from '$lib/server/api/handler';
import { computedJson } from '$lib/server/api/respond';
import { titrationAnswer } from '$lib/server/calc/answers';
import { calculate, callerOf, checkCaller } from '$lib/server/calc/compute';
import type { RequestHandler } from './$types';

/** POST /api/v1/calc/titration — Nernst fit of { points: [{ potentialMv, signal }], components, n?, temperatureK? }. */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = callerOf(event);
	checkCaller(caller);
	const body = await parseJsonBody(event.request, titrationRequestSchema);
	if (!body.ok) return body.response;
	const { points, ...options } = body.data;
	const fit = await calculate({ kind: 'titration', points, options }, caller);
	return computedJson(titrationAnswer(fit));
});
