import { json } from '@sveltejs/kit';
import { suggestionQuerySchema, type SuggestionList } from '$lib/schemas/suggestions';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, parseApiQuery } from '$lib/server/api/respond';
import { suggestEntries } from '$lib/server/catalogue/suggestions';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/suggestions — approved centres, proteins or sources whose accession, name or
 * label contain the typed words: what an entry form's reference field offers while typing.
 * Only entries the reader may see.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, suggestionQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const answer: SuggestionList = { items: await suggestEntries(db, query.data, locals.viewer) };
	return json(answer, { headers: { 'cache-control': 'private, no-cache' } });
});
