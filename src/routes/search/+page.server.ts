import { error } from '@sveltejs/kit';
import type { CatalogueFacets, PotentialDto, Page } from '$lib/catalogue/dto';
import type { ApiErrorBody } from '$lib/schemas/apiError';
import { LIST_KEYS, potentialPageQuery } from '$lib/schemas/catalogueQuery';
import { parseSearchParams } from '$lib/schemas/searchParams';
import {
	apiParamsForPage,
	exportParamsForPage,
	facetParamsForPage
} from '$lib/server/catalogue/searchRequests';
import { searchFacets, searchRows } from '$lib/server/catalogue/searchRows';
import type { PageServerLoad } from './$types';

// Every page of results, the first and each one after a change of the URL, is read from the read
// API (SvelteKit's server `fetch` calls the endpoint in-process, as the reader), so the table and
// the API can never disagree. The query is parsed here, on the server, so that the page's browser
// code needs no schema library, number formats or vocabularies: it gets the parsed query, the
// rows and facets as text to show (searchRows.ts) and ready-made download links.
export const load: PageServerLoad = async ({ url, fetch }) => {
	const parsed = parseSearchParams(potentialPageQuery, url.searchParams, LIST_KEYS);
	if (!parsed.ok) {
		error(400, { message: 'Some search parameters are not valid.', fields: parsed.fields });
	}
	const query = parsed.data;
	const rowsParams = apiParamsForPage(query);
	const [rows, facets] = await Promise.all([
		fetch(`/api/v1/potentials?${rowsParams}`),
		fetch(`/api/v1/facets?${facetParamsForPage(query)}`)
	]);
	if (!rows.ok) {
		const body = (await rows.json()) as ApiErrorBody;
		error(rows.status, { message: body.error.message, fields: body.error.fields });
	}
	return {
		query,
		results: searchRows((await rows.json()) as Page<PotentialDto>),
		facets: searchFacets((await facets.json()) as CatalogueFacets, query),
		/** This page's rows as CSV, straight from the API. */
		pageCsvHref: `/api/v1/potentials?${rowsParams}&format=csv`,
		/** Every matching row as CSV, in the page's order. */
		exportHref: `/api/v1/potentials/export?${exportParamsForPage(query)}`
	};
};
