import { citationFilePath } from '$lib/catalogue/citation';
import { apiHandler } from '$lib/server/api/handler';
import { latestVisibleVersion } from '$lib/server/catalogue/entryView';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/**
 * GET /e/HL000123/cite.bib (.ris, .json) — the citation of the latest version: a redirect to
 * that version's file, so that what is saved names the version it cites. The query (an access
 * date) goes along.
 */
export const GET: RequestHandler = apiHandler(async ({ params, url, locals }) => {
	const latest = await latestVisibleVersion(db, params.accession, locals.viewer);
	const location = citationFilePath(latest.accession, latest.version, params.format) + url.search;
	return new Response(null, { status: 303, headers: { location } });
});
