import type { Kysely } from 'kysely';
import { isAccession } from '$lib/schemas/accession';
import type { Database } from '../db/schema';
import { centreSearch } from '../search/centreSearch';

/**
 * What a free-text query selects: an exact accession, or the centres the search index ranks
 * for it (best first), or nothing to filter on.
 */
export type TextMatch =
	| { kind: 'none' }
	| { kind: 'accession'; accession: string }
	/** Centres best first, with their scores (the same order). */
	| { kind: 'centres'; ids: number[]; scores: number[] };

export async function resolveTextQuery(
	db: Kysely<Database>,
	q: string | undefined
): Promise<TextMatch> {
	const text = q?.trim() ?? '';
	if (text === '') return { kind: 'none' };
	const upper = text.toUpperCase();
	if (isAccession(upper)) return { kind: 'accession', accession: upper };
	await centreSearch.ensureCurrent(db);
	const found = centreSearch.searchScored(text);
	return { kind: 'centres', ids: found.map((c) => c.id), scores: found.map((c) => c.score) };
}
