import MiniSearch, { type SearchOptions } from 'minisearch';
import type { Kysely } from 'kysely';
import { COFACTOR_KIND_LABELS, type CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
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
 * Both indexes follow the catalogue's revision counter: every approval bumps it inside its
 * transaction, and each search first folds in rows changed since the index last looked —
 * whether the change came from this process or another one (a seed script, say).
 */

const tokenize = (text: string) => text.split(/[\s\-[\]()/,;:.]+/u).filter((t) => t.length > 0);

/** Per word: a prefix only for the last (it may still be being typed); one typo in long words. */
function wordOptions(isLast: boolean, word: string): SearchOptions {
	return { prefix: isLast, fuzzy: word.length >= 5 ? 1 : false, maxFuzzy: 1 };
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
		searchOptions: { boost: { name: 3, organism: 1.5, accession: 3 } }
	});
}

function centreIndex() {
	return new MiniSearch<CentreDocument>({
		fields: ['label', 'kind', 'ligation', 'accession'],
		tokenize,
		searchOptions: { boost: { label: 2.5, kind: 2, accession: 3 } }
	});
}

export class CentreSearch {
	private proteins = proteinIndex();
	private centres = centreIndex();
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
			const kindLabel = COFACTOR_KIND_LABELS[c.cofactor_kind as CofactorKind] ?? c.cofactor_kind;
			this.upsert(this.centres, {
				id: c.id,
				label: c.label,
				kind: `${kindLabel} ${c.cofactor_kind}`,
				ligation: c.ligation ?? '',
				accession: c.accession
			});
		}
		this.revision = target;
	}

	private upsert<T extends { id: number }>(index: MiniSearch<T>, doc: T): void {
		if (index.has(doc.id)) index.replace(doc);
		else index.add(doc);
	}

	/** Centre entry ids matching every word of the text, best first. */
	search(query: string): number[] {
		return this.searchScored(query).map((r) => r.id);
	}

	/** The same centres with their scores (the sum over words of centre and protein scores). */
	searchScored(query: string): { id: number; score: number }[] {
		const words = tokenize(query);
		if (words.length === 0) return [];
		const perWord = words.map((word, i) => {
			const options = wordOptions(i === words.length - 1, word);
			const scores = (results: { id: unknown; score: number }[]) =>
				new Map(results.map((r) => [r.id as number, r.score]));
			return {
				centres: scores(this.centres.search(word, options)),
				proteins: scores(this.proteins.search(word, options))
			};
		});

		// Candidates come from the word with the fewest centres it can reach.
		const reach = (w: (typeof perWord)[number]) =>
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
		return this.proteins.documentCount + this.centres.documentCount;
	}
}

/** One index per server process: it holds only catalogue text, never per-user state. */
export const centreSearch = new CentreSearch();
