import { error } from '@sveltejs/kit';
import type { CatalogueFacets, PotentialDto, Page } from '$lib/catalogue/dto';
import { apiParamsForPage, facetParamsForPage } from '$lib/catalogue/searchUrl';
import type { ApiErrorBody } from '$lib/schemas/apiError';
import { LIST_KEYS, potentialPageQuery } from '$lib/schemas/catalogueQuery';
import { parseSearchParams } from '$lib/schemas/searchParams';
import type { PageLoad } from './$types';

// The first page renders on the server; after that every change of the URL fetches the read
// API from the browser, so the table and the API can never disagree.
export const load: PageLoad = async ({ url, fetch }) => {
	const parsed = parseSearchParams(potentialPageQuery, url.searchParams, LIST_KEYS);
	if (!parsed.ok) {
		error(400, { message: 'Some search parameters are not valid.', fields: parsed.fields });
	}
	const query = parsed.data;
	const [rows, facets] = await Promise.all([
		fetch(`/api/v1/potentials?${apiParamsForPage(query)}`),
		fetch(`/api/v1/facets?${facetParamsForPage(query)}`)
	]);
	if (!rows.ok) {
		const body = (await rows.json()) as ApiErrorBody;
		error(rows.status, { message: body.error.message, fields: body.error.fields });
	}
	return {
		query,
		results: (await rows.json()) as Page<PotentialDto>,
		facets: (await facets.json()) as CatalogueFacets
	};
};
