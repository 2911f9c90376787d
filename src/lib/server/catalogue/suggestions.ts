import { sql, type Expression, type ExpressionBuilder, type Kysely, type SqlBool } from 'kysely';
import {
	suggestionWords,
	type Suggestion,
	type SuggestionQuery,
	type SuggestionType
} from '$lib/schemas/suggestions';
import { COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { readJson } from '../db/json';
import { entryIsVisible, type Viewer } from './visibility';

/*
 * Suggestions for an entry form's reference fields: approved centres, proteins and sources the
 * reader may see whose accession, name, label (and for centres their protein and organism; for
 * sources their DOI, authors and year) contain every typed word. Only the read model is read, so
 * a draft or pending entry is never suggested, and the visibility rule (visibility.ts) is applied
 * in SQL as everywhere else: a centre is suggested only when its protein is visible too.
 *
 * Cost: at most four words (schemas/suggestions.ts), each a LIKE over a handful of columns of
 * one table (two for centres), and at most 20 rows returned.
 */

/** A LIKE pattern that finds `word` anywhere, with LIKE's own wildcards taken literally. */
function containing(word: string): string {
	return `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

type Columns = readonly string[];

/** Every word is found in at least one of the columns. */
function everyWordIn<DB, TB extends keyof DB>(
	eb: ExpressionBuilder<DB, TB>,
	words: readonly string[],
	columns: Columns
): Expression<SqlBool> {
	return eb.and(
		words.map((word) => {
			const pattern = containing(word);
			return eb.or(columns.map((c) => sql<SqlBool>`${sql.ref(c)} like ${pattern} escape '\\'`));
		})
	);
}

/** Begins with the first word: ranked first. */
const startsWith = (column: string, word: string) =>
	sql<number>`case when ${sql.ref(column)} like ${`${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`} escape '\\' then 0 else 1 end`;

export async function suggestEntries(
	db: Kysely<Database>,
	query: SuggestionQuery,
	viewer: Viewer | null
): Promise<Suggestion[]> {
	const words = suggestionWords(query.q);
	if (words.length === 0) return [];
	const first = words[0] as string;
	const type: SuggestionType = query.type;
	if (type === 'centre') {
		const rows = await db
			.selectFrom('centre as c')
			.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
			.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
			.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
			.where((eb) => eb.and([entryIsVisible(eb, 'ce', viewer), entryIsVisible(eb, 'pe', viewer)]))
			.where((eb) =>
				everyWordIn(eb, words, [
					'ce.accession',
					'c.label',
					'c.cofactor_kind',
					'pr.name',
					'pr.organism',
					'pe.accession'
				])
			)
			.select(['ce.accession', 'c.label', 'c.cofactor_kind', 'pr.name', 'pr.organism'])
			.orderBy(startsWith('ce.accession', first))
			.orderBy(startsWith('c.label', first))
			.orderBy('pr.name')
			.orderBy('c.label')
			.limit(query.limit)
			.execute();
		return rows.map((r) => ({
			accession: r.accession,
			type,
			title: r.label,
			detail: `${COFACTOR_KIND_LABELS[r.cofactor_kind] ?? r.cofactor_kind} · ${r.name} (${r.organism})`
		}));
	}
	if (type === 'protein') {
		const rows = await db
			.selectFrom('protein as pr')
			.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
			.where((eb) => entryIsVisible(eb, 'pe', viewer))
			.where((eb) =>
				everyWordIn(eb, words, ['pe.accession', 'pr.name', 'pr.organism', 'pr.uniprot'])
			)
			.select(['pe.accession', 'pr.name', 'pr.organism', 'pr.uniprot'])
			.orderBy(startsWith('pe.accession', first))
			.orderBy(startsWith('pr.name', first))
			.orderBy('pr.name')
			.limit(query.limit)
			.execute();
		return rows.map((r) => ({
			accession: r.accession,
			type,
			title: r.name,
			detail: r.uniprot ? `${r.organism} · UniProtKB ${r.uniprot}` : r.organism
		}));
	}
	const rows = await db
		.selectFrom('source as s')
		.innerJoin('entry as se', 'se.id', 's.entry_id')
		.where((eb) => entryIsVisible(eb, 'se', viewer))
		.where((eb) =>
			everyWordIn(eb, words, [
				'se.accession',
				's.title',
				's.doi',
				's.authors',
				's.journal',
				's.pubmed_id',
				// A year is matched as text ("2026").
				's.year'
			])
		)
		.select(['se.accession', 's.title', 's.authors', 's.year', 's.doi'])
		.orderBy(startsWith('se.accession', first))
		.orderBy('s.year', 'desc')
		.orderBy('s.title')
		.limit(query.limit)
		.execute();
	return rows.map((r) => {
		const authors = readJson(r.authors);
		const lead = authors[0]?.split(',')[0]?.trim();
		const who = lead ? (authors.length > 1 ? `${lead} et al.` : lead) : null;
		return {
			accession: r.accession,
			type,
			title: r.title,
			detail: [who, r.year, r.doi ? `doi:${r.doi}` : null].filter((x) => x !== null).join(' · ')
		};
	});
}
