import { hopRateQuerySchema } from '$lib/schemas/calc';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { RATE_CAUTION, runHopRate } from '$lib/server/calc/hopRate';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => {
	const values = Object.fromEntries(url.searchParams);
	if (url.searchParams.size === 0)
		return { values, errors: undefined, result: null, caution: RATE_CAUTION };
	const query = parseSearchParams(hopRateQuerySchema, url.searchParams);
	if (!query.ok) return { values, errors: query.fields, result: null, caution: RATE_CAUTION };
	return {
		values,
		errors: undefined,
		result: runHopRate(query.data),
		query: query.data,
		caution: RATE_CAUTION
	};
};
