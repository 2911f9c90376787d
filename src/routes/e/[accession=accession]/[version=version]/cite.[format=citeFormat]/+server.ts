import { citationFileQuerySchema } from '$lib/schemas/citationQuery';
import { parseVersionSegment } from '$lib/schemas/accession';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, parseApiQuery } from '$lib/server/api/respond';
import { EntryNotFoundError } from '$lib/server/catalogue/errors';
import { citationFile } from '$lib/server/citations/files';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/**
 * GET /e/HL000123/v2/cite.bib (.ris, .json)[?accessed=YYYY-MM-DD] — the version's citation as a
 * file to save, for links that work without scripts. The entry page adds the reader's local
 * date as `accessed` once the browser knows it.
 */
export const GET: RequestHandler = apiHandler(async ({ params, url, locals }) => {
	const query = parseApiQuery(url, citationFileQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const version = parseVersionSegment(params.version);
	if (version === null) throw new EntryNotFoundError(params.accession);
	const file = await citationFile(
		db,
		{
			accession: params.accession,
			version,
			extension: params.format,
			accessed: query.data.accessed ?? null
		},
		locals.viewer,
		url.origin
	);
	return new Response(file.body, {
		headers: {
			'content-type': file.mediaType,
			'content-disposition': `attachment; filename="${file.filename}"`
		}
	});
});
