import type { EntryAttachment, EntryView } from '$lib/catalogue/dto';
import { toPublicFields } from '$lib/kinds/publicNames';
import { permalinkPath } from '$lib/schemas/accession';
import { entryApiQuerySchema } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, parseApiQuery } from '$lib/server/api/respond';
import { apiAttachmentsOfVersion } from '$lib/server/attachments/shownAttachments';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/*
 * GET /api/v1/entries/HL000123[?version=2] — one entry at a given version, or at its latest.
 *
 * The answer's members are the frozen version (identical for as long as the version exists:
 * data, title, references at the versions they were pinned to on approval, permalinks), save
 * `live`: what is true of the entry now (latest version, version history, visibility, newer
 * versions of what it names). `attachments` lists the version's files with absolute URLs. A request for a version (`?version=N`) gets no `live` at all,
 * so that its answer never changes; it says where the current state is (`latest`). A
 * reference the reader may not see is left out (its field reads null) in either.
 */

/**
 * The frozen version, with absolute permalinks and its attachment list (frozen with it at
 * approval); the same bytes whenever it is asked for.
 */
function frozenAnswer(view: EntryView, url: URL, attachments: EntryAttachment[]) {
	const permalink = (accession: string, version: number) =>
		new URL(permalinkPath(accession, version), url).href;
	return {
		accession: view.accession,
		kind: view.kind,
		version: view.version,
		approvedAt: view.approvedAt,
		changeNote: view.changeNote,
		title: view.title,
		isDemo: view.isDemo,
		// The version's stored fields under their public names (kinds/publicNames.ts).
		data: toPublicFields(view.data),
		references: Object.fromEntries(
			Object.entries(view.references).map(([field, r]) => [
				field,
				{ ...r, permalink: permalink(r.accession, r.version) }
			])
		),
		permalink: permalink(view.accession, view.version),
		attachments
	};
}

export const GET: RequestHandler = apiHandler(async ({ url, params, locals }) => {
	const query = parseApiQuery(url, entryApiQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const view = await getEntryView(db, params.accession, query.data.version, locals.viewer);
	const attachments = await apiAttachmentsOfVersion(db, view.accession, view.version, url);
	const frozen = frozenAnswer(view, url, attachments);
	if (query.data.version !== undefined)
		return Response.json({
			...frozen,
			latest: new URL(`/api/v1/entries/${view.accession}`, url).href
		});
	return Response.json({ ...frozen, live: view.live });
});
