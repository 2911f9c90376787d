import MiniSearch, { type SearchOptions } from 'minisearch';
import type { Kysely } from 'kysely';
import {
	cofactorKindText,
	methodWords,
	parseQuery,
	searchWords,
	type CoupleKey,
	type QueryTerm
} from '$lib/catalogue/searchTerms';
import { POTENTIAL_METHODS, type CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { readJson } from '../db/json';
import { readCatalogueRevision } from '../db/revision';

/*
 * Full-text search that finds centres. Text describing a protein (name, organism, accession)
 * is indexed once per protein and text describing a centre (label, cofactor kind, ligation,
 * accession) once per centre, so a word such as an organism shared by thousands of centres
 * costs one posting per protein, not one per centre. A centre matches a query when every word
 * matches the centre itself or its protein (AND semantics); its score is the sum of both.
 * The ranked centre ids go to the callers (through `catalogue/textMatch.ts`): a potential search
 * filters, counts, sorts and pages them in the in-memory potential columns (`potentialIndex.ts`,
 * visibility included) and then reads the page's rows from SQLite by id, checking visibility
 * again; the protein and centre lists apply filters, visibility and paging in SQL.
 *
 * Words are read by one module, `$lib/catalogue/searchTerms.ts`, both when text is indexed and
 * when a query is read: cluster spellings, synonyms, two-word cofactor names, couples and DOIs.
 * Besides centres and proteins, a word may match a potential's source (authors, year, PubMed
 * ID; a DOI is looked up whole) or its method (label and abbreviations: EPR, PFV, SEC, MCD …),
 * and a couple term matches potentials' couples: `match` says, per term, what it reaches, and
 * the potential index tests each row against every term (`potentialIndex.ts`).
 *
 * Both indexes follow the catalogue's revision counter: every approval bumps it inside its
 * transaction, and each search first folds in rows changed since the index last looked —
 * whether the change came from this process or another one (a seed script, say).
 */

const tokenize = searchWords;
const asIs = (term: string) => term;

/** Per word: a prefix when parseQuery says so (the last); one typo where it allows one. */
function wordOptions(word: { prefix: boolean; fuzzy: boolean }): SearchOptions {
	return {
		prefix: word.prefix,
		fuzzy: word.fuzzy ? 1 : false,
		maxFuzzy: 1,
		tokenize: (t) => [t],
		processTerm: asIs
	};
}

/** What one query term reaches; a potential matches the term when any of it is its own. */
export interface TermMatch {
	/** Centre and protein entry ids, with scores. */
	centres: Map<number, number>;
	proteins: Map<number, number>;
	/** Source entry ids, with scores (the caller keeps only sources the reader may see). */
	sources: Map<number, number>;
	/** Method identifiers, with scores. */
	methods: Map<string, number>;
	/** A couple the potential's couple must match (`coupleMatches`). */
	couple: CoupleKey | null;
}

/** Scores of a method or couple match, on the scale of minisearch's field scores. */
const METHOD_SCORE = 2;

interface SourceDocument {
	id: number;
	authors: string;
	year: string;
	pubmed: string;
}

interface ProteinDocument {
	id: number;
	name: string;
	organism: string;
	accession: string;
}

interface CentreDocument {
	id: number;
	label: string;
	kind: string;
	ligation: string;
	accession: string;
}

function proteinIndex() {
	return new MiniSearch<ProteinDocument>({
		fields: ['name', 'organism', 'accession'],
		tokenize,
		processTerm: asIs,
		searchOptions: { boost: { name: 3, organism: 1.5, accession: 3 } }
	});
}

function centreIndex() {
	return new MiniSearch<CentreDocument>({
		fields: ['label', 'kind', 'ligation', 'accession'],
		tokenize,
		processTerm: asIs,
		searchOptions: { boost: { label: 2.5, kind: 2, accession: 3 } }
	});
}

function sourceIndex() {
	return new MiniSearch<SourceDocument>({
		fields: ['authors', 'year', 'pubmed'],
		tokenize,
		processTerm: asIs,
		searchOptions: { boost: { authors: 2, year: 1, pubmed: 3 } }
	});
}

/** Each method's words (label and abbreviations), from the vocabulary. */
const METHOD_WORDS = POTENTIAL_METHODS.map((m) => ({ method: m, words: new Set(methodWords(m)) }));

export class CentreSearch {
	private proteins = proteinIndex();
	private centres = centreIndex();
	private sources = sourceIndex();
	private sourcesByDoi = new Map<string, number[]>();
	private proteinOf = new Map<number, number>();
	private centresOf = new Map<number, Set<number>>();
	private revision = -1;
	private refreshing: Promise<void> | null = null;

	/** Folds proteins and centres changed since the last look into the indexes. */
	async ensureCurrent(db: Kysely<Database>): Promise<void> {
		while (this.refreshing) await this.refreshing;
		const revision = await readCatalogueRevision(db);
		if (revision === this.revision) return;
		this.refreshing = this.refresh(db, revision).finally(() => {
			this.refreshing = null;
		});
		await this.refreshing;
	}

	private async refresh(db: Kysely<Database>, target: number): Promise<void> {
		const proteins = await db
			.selectFrom('protein as p')
			.innerJoin('entry as e', 'e.id', 'p.entry_id')
			.select(['p.entry_id as id', 'p.name', 'p.organism', 'e.accession'])
			.where('p.revision', '>', this.revision)
			.execute();
		for (const doc of proteins) this.upsert(this.proteins, doc);

		const centres = await db
			.selectFrom('centre as c')
			.innerJoin('entry as e', 'e.id', 'c.entry_id')
			.select([
				'c.entry_id as id',
				'c.protein_entry_id',
				'c.label',
				'c.cofactor_kind',
				'c.ligation',
				'e.accession'
			])
			.where('c.revision', '>', this.revision)
			.execute();
		for (const c of centres) {
			const previous = this.proteinOf.get(c.id);
			if (previous !== undefined) this.centresOf.get(previous)?.delete(c.id);
			this.proteinOf.set(c.id, c.protein_entry_id);
			if (!this.centresOf.has(c.protein_entry_id))
				this.centresOf.set(c.protein_entry_id, new Set());
			this.centresOf.get(c.protein_entry_id)?.add(c.id);
			this.upsert(this.centres, {
				id: c.id,
				label: c.label,
				kind: cofactorKindText(c.cofactor_kind as CofactorKind),
				ligation: c.ligation ?? '',
				accession: c.accession
			});
		}

		// Sources are few beside potentials and carry no revision of their own: read them whole.
		const sources = await db
			.selectFrom('source')
			.select(['entry_id as id', 'doi', 'pubmed_id', 'authors', 'year'])
			.execute();
		const index = sourceIndex();
		const byDoi = new Map<string, number[]>();
		index.addAll(
			sources.map((s) => ({
				id: s.id,
				authors: readJson(s.authors).join(' ; '),
				year: s.year === null ? '' : String(s.year),
				pubmed: s.pubmed_id ?? ''
			}))
		);
		for (const s of sources) {
			if (!s.doi) continue;
			const doi = s.doi.toLowerCase();
			byDoi.set(doi, [...(byDoi.get(doi) ?? []), s.id]);
		}
		this.sources = index;
		this.sourcesByDoi = byDoi;
		this.revision = target;
	}

	private upsert<T extends { id: number }>(index: MiniSearch<T>, doc: T): void {
		if (index.has(doc.id)) index.replace(doc);
		else index.add(doc);
	}

	/** What each term of a query reaches (see `TermMatch`); an empty list for blank text. */
	match(query: string): TermMatch[] {
		return parseQuery(query).map((term) => this.matchTerm(term));
	}

	private matchTerm(term: QueryTerm): TermMatch {
		const match: TermMatch = {
			centres: new Map(),
			proteins: new Map(),
			sources: new Map(),
			methods: new Map(),
			couple: null
		};
		const scores = (results: { id: unknown; score: number }[]) =>
			new Map(results.map((r) => [r.id as number, r.score]));
		if (term.type === 'couple') {
			match.couple = term.couple;
		} else if (term.type === 'doi') {
			for (const [doi, ids] of this.sourcesByDoi)
				if (doi === term.doi || (term.doi.length >= 12 && doi.startsWith(term.doi)))
					for (const id of ids) match.sources.set(id, 3);
		} else {
			const options = wordOptions(term);
			match.centres = scores(this.centres.search(term.word, options));
			match.proteins = scores(this.proteins.search(term.word, options));
			match.sources = scores(this.sources.search(term.word, options));
			for (const { method, words } of METHOD_WORDS) {
				const hit =
					words.has(term.word) ||
					(term.prefix && term.word.length >= 3 && [...words].some((w) => w.startsWith(term.word)));
				if (hit) match.methods.set(method, METHOD_SCORE);
			}
		}
		return match;
	}

	/** Centre entry ids matching every word of the text, best first. */
	search(query: string): number[] {
		return this.searchScored(query).map((r) => r.id);
	}

	/**
	 * Centres matching every word of the text with their scores (the sum over words of centre
	 * and protein scores), for the protein and centre lists. Terms only a potential can match
	 * are left out there: a couple counts by its cluster ("[4Fe-4S]2+/1+" finds [4Fe-4S]
	 * centres), a DOI, a bare charge pair, a method or an author not at all.
	 */
	searchScored(query: string): { id: number; score: number }[] {
		const perWord = parseQuery(query).flatMap((term): TermMatch[] => {
			if (term.type === 'word') return [this.matchTerm(term)];
			if (term.type === 'couple' && /^\d+fe\d+s$/.test(term.couple.prefix))
				return [
					this.matchTerm({ type: 'word', word: term.couple.prefix, prefix: false, fuzzy: false })
				];
			return [];
		});
		if (perWord.length === 0) return [];

		// Candidates come from the word with the fewest centres it can reach.
		const reach = (w: TermMatch) =>
			w.centres.size +
			[...w.proteins.keys()].reduce((n, p) => n + (this.centresOf.get(p)?.size ?? 0), 0);
		const seed = perWord.reduce((best, w) => (reach(w) < reach(best) ? w : best));
		const candidates = new Set(seed.centres.keys());
		for (const p of seed.proteins.keys())
			for (const c of this.centresOf.get(p) ?? []) candidates.add(c);

		const scored: { id: number; score: number }[] = [];
		for (const id of candidates) {
			const protein = this.proteinOf.get(id);
			let score = 0;
			let matchesAll = true;
			for (const w of perWord) {
				const s =
					(w.centres.get(id) ?? 0) + (protein === undefined ? 0 : (w.proteins.get(protein) ?? 0));
				if (s === 0) {
					matchesAll = false;
					break;
				}
				score += s;
			}
			if (matchesAll) scored.push({ id, score });
		}
		return scored.sort((a, b) => b.score - a.score || a.id - b.id);
	}

	get documentCount(): number {
		return this.proteins.documentCount + this.centres.documentCount + this.sources.documentCount;
	}
}

/** One index per server process: it holds only catalogue text, never per-user state. */
export const centreSearch = new CentreSearch();
