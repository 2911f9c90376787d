import { z } from 'zod';
import { fieldErrors } from './fieldErrors';
import { RELATED_LISTS } from './relatedLists';

/*
 * Which page of each related list an entry page shows (`?potentials=3`); the lists, their page
 * size and the links between pages are in relatedLists.ts.
 */

const pageNumber = z.coerce
	.number({ error: 'expected a page number' })
	.int('expected a whole page number')
	.min(1, 'pages start at 1')
	.max(1_000_000, 'at most page 1 000 000')
	.default(1);

export const relatedPagesSchema = z.object({
	centres: pageNumber,
	potentials: pageNumber,
	spinRecords: pageNumber,
	distances: pageNumber
});
export type RelatedPages = z.infer<typeof relatedPagesSchema>;

/** The page numbers in a URL's query; unrelated parameters are ignored, bad numbers named. */
export function parseRelatedPages(
	params: URLSearchParams
): { ok: true; pages: RelatedPages } | { ok: false; fields: Record<string, string[]> } {
	const raw: Record<string, string> = {};
	for (const list of RELATED_LISTS) {
		const v = params.get(list);
		if (v !== null) raw[list] = v;
	}
	const parsed = relatedPagesSchema.safeParse(raw);
	if (parsed.success) return { ok: true, pages: parsed.data };
	return { ok: false, fields: fieldErrors(parsed.error) };
}
