import { titrationRequestSchema } from '$lib/schemas/calc';
import { parseJsonBody } from '$lib/server/api/body';
import { apiHandler } from '$lib/server/api/handler';
import { computedJson } from '$lib/server/api/respond';
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
	return computedJson({
		...fit,
		units: { emMv: 'mV (same reference as the potentials sent)', temperatureK: 'K' },
		caution:
			'Standard errors assume independent, equal-variance noise and a correct Nernstian model; they do not include systematic errors such as mediator equilibration or electrode calibration.'
	});
});
