import { hopRateQuerySchema } from '$lib/schemas/calc';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, computedJson, parseApiQuery } from '$lib/server/api/respond';
import { RATE_CAUTION, runHopRate } from '$lib/server/calc/hopRate';
import type { RequestHandler } from './$types';

/** GET /api/v1/calc/hop-rate?distance=&dG=&lambda=&model=&temperature=&packing= */
export const GET: RequestHandler = apiHandler(async ({ url }) => {
	const query = parseApiQuery(url, hopRateQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const result = runHopRate(query.data);
	const chosen = result.estimates[query.data.model];
	return computedJson({
		model: chosen.model,
		rateForward: chosen.rateForward,
		rateBackward: chosen.rateBackward,
		log10RateForward: chosen.log10RateForward,
		log10RateBackward: chosen.log10RateBackward,
		warnings: chosen.warnings,
		inputs: query.data,
		units: {
			rate: 's⁻¹',
			distance: 'Å',
			dG: 'eV (negative downhill)',
			lambda: 'eV',
			temperature: 'K'
		},
		caution: RATE_CAUTION
	});
});
