import { hopRateQuerySchema } from '$lib/schemas/calc';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { RATE_VALIDITY, runHopRate } from '$lib/server/calc/hopRate';
import type { PageServerLoad } from './$types';

/*
 * A GET form: the inputs travel in the URL, so the values entered stay in the form after a run
 * (as typed: "−0,2" stays "−0,2"), with or without JavaScript.
 */
export const load: PageServerLoad = ({ url }) => {
	const values = Object.fromEntries(url.searchParams);
	const shown = { values, validity: RATE_VALIDITY };
	if (url.searchParams.size === 0) return { ...shown, errors: undefined, result: null };
	const query = parseSearchParams(hopRateQuerySchema, url.searchParams);
	if (!query.ok) return { ...shown, errors: query.fields, result: null };
	return { ...shown, errors: undefined, result: runHopRate(query.data), query: query.data };
};
