import type { Kysely } from 'kysely';
import { isAccession } from '$lib/schemas/accession';
import type { Database } from '../db/schema';
import { centreSearch } from '../search/centreSearch';
import type { TextTerm } from '../search/potentialIndex';
import { entryIsVisible, type Viewer } from './visibility';

/**
 * What a free-text query selects: an exact accession, or the centres the search index ranks
 * for it (best first), or nothing to filter on.
 */
export type TextMatch =
	| { kind: 'none' }
	| { kind: 'accession'; accession: string }
	/** Centres best first, with their scores (the same order). */
	| { kind: 'centres'; ids: number[]; scores: number[] };

/** The text of a protein or centre list: centres matching every word (see `searchScored`). */
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

/** What the text of a potential search selects: an accession, or terms every row must match. */
export type PotentialText =
	| { kind: 'none' }
	| { kind: 'accession'; accession: string }
	| { kind: 'terms'; terms: TextTerm[] };

/**
 * The text of a potential search as terms for the potential index. A source the reader may not
 * see matches nothing (its authors, year and DOI are hidden from them; a public potential may
 * cite a group-only source). Centres, proteins and couples need no such step: a potential is
 * visible only when its centre and protein are, and the index applies that to every row.
 */
export async function resolvePotentialText(
	db: Kysely<Database>,
	q: string | undefined,
	viewer: Viewer | null
): Promise<PotentialText> {
	const text = q?.trim() ?? '';
	if (text === '') return { kind: 'none' };
	const upper = text.toUpperCase();
	if (isAccession(upper)) return { kind: 'accession', accession: upper };
	await centreSearch.ensureCurrent(db);
	const terms = centreSearch.match(text);
	if (terms.length === 0) return { kind: 'none' };
	const sourceIds = [...new Set(terms.flatMap((t) => [...t.sources.keys()]))];
	const visible = new Set<number>();
	for (let i = 0; i < sourceIds.length; i += 500) {
		const rows = await db
			.selectFrom('entry as se')
			.select('se.id')
			.where('se.id', 'in', sourceIds.slice(i, i + 500))
			.where((eb) => entryIsVisible(eb, 'se', viewer))
			.execute();
		for (const r of rows) visible.add(r.id);
	}
	return {
		kind: 'terms',
		terms: terms.map((t) => ({
			centres: t.centres,
			proteins: t.proteins,
			sources: new Map([...t.sources].filter(([id]) => visible.has(id))),
			methods: t.methods,
			couple: t.couple ?? undefined
		}))
	};
}
