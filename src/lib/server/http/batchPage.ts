import { parseSearchParams } from '$lib/schemas/searchParams';
import { BATCH_PAGE_SIZE, batchQuerySchema } from '$lib/schemas/submission';
import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { loadBatchRows } from '../curation/batchRows';
import { queryError } from './failures';

/** The page of a CSV batch a submission page shows, from its URL (?page, ?flagged). */
export async function batchForPage(db: Kysely<Database>, url: URL, submissionId: number) {
	// Other parameters of the page (notices such as ?uploaded) are not the batch's business.
	const params = new URLSearchParams();
	for (const key of ['page', 'flagged']) {
		for (const v of url.searchParams.getAll(key)) params.append(key, v);
	}
	const query = parseSearchParams(batchQuerySchema, params);
	if (!query.ok) queryError(query.fields);
	const flagged = query.data.flagged === '1';
	const rows = await loadBatchRows(db, submissionId, {
		offset: (query.data.page - 1) * BATCH_PAGE_SIZE,
		limit: BATCH_PAGE_SIZE,
		flagged
	});
	return { ...rows, page: query.data.page, pageSize: BATCH_PAGE_SIZE, flagged };
}
