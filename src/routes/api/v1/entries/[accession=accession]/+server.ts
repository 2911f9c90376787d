import { toPublicFields } from '$lib/kinds/publicNames';
import { permalinkPath } from '$lib/schemas/accession';
import { entryApiQuerySchema } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, parseApiQuery } from '$lib/server/api/respond';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** GET /api/v1/entries/HL000123[?version=2] — one entry at its latest or a given version. */
export const GET: RequestHandler = apiHandler(async ({ url, params, locals }) => {
	const query = parseApiQuery(url, entryApiQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const view = await getEntryView(db, params.accession, query.data.version, locals.viewer);
	return Response.json({
		...view,
		// The version's stored fields under their public names (kinds/publicNames.ts).
		data: toPublicFields(view.data),
		permalink: new URL(permalinkPath(view.accession, view.version), url).href
	});
});
