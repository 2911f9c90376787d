import { fitNernst } from '$lib/science';
import { titrationRequestSchema } from '$lib/schemas/calc';
import { parseJsonBody } from '$lib/server/api/body';
import { apiHandler } from '$lib/server/api/handler';
import { apiError, computedJson } from '$lib/server/api/respond';
import type { RequestHandler } from './$types';

/** POST /api/v1/calc/titration — Nernst fit of { points: [{ potentialMv, signal }], components, n?, temperatureK? }. */
export const POST: RequestHandler = apiHandler(async ({ request }) => {
	const body = await parseJsonBody(request, titrationRequestSchema);
	if (!body.ok) return body.response;
	const { points, ...options } = body.data;
	let fit;
	try {
		fit = fitNernst(points, options);
	} catch (e) {
		if (e instanceof RangeError) return apiError('bad_request', e.message, { points: [e.message] });
		throw e;
	}
	return computedJson({
		...fit,
		units: { emMv: 'mV (same reference as the potentials sent)', temperatureK: 'K' },
		caution:
			'Standard errors assume independent, equal-variance noise and a correct Nernstian model; they do not include systematic errors such as mediator equilibration or electrode calibration.'
	});
});
