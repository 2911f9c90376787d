import MiniSearch from 'minisearch';
import type { Kysely } from 'kysely';
import { COFACTOR_KIND_LABELS, type CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';

/**
 * Full-text search over centres (with their protein's name and organism). Text finds centres;
 * numeric and vocabulary filters, visibility and paging are applied in SQL afterwards, which
 * keeps the index small (one document per centre, not per measurement) and queries fast.
 *
 * The index follows the catalogue's revision counter: every approval bumps it inside its
 * transaction, and each search first folds in centres changed since the index last looked —
 * whether the change came from this process or another one (a seed script, say).
 */

interface CentreDocument {
	id: number;
	accession: string;
	label: string;
	kind: string;
	ligation: string;
	protein: string;
	proteinAccession: string;
	organism: string;
}

const FIELDS = ['accession', 'label', 'kind', 'ligation', 'protein', 'proteinAccession', 'organism'];

function createIndex(): MiniSearch<CentreDocument> {
	return new MiniSearch<CentreDocument>({
		fields: FIELDS,
		storeFields: [],
		// Keep bracketed cluster names searchable: "[4Fe-4S]" → "4fe", "4s".
		tokenize: (text) => text.split(/[\s\-[\]()/,;:.]+/u).filter((t) => t.length > 0),
		searchOptions: {
			boost: { protein: 3, label: 2.5, kind: 2, organism: 1.5, accession: 3, proteinAccession: 2 },
			prefix: true,
			// Typos are forgiven only in words long enough for a fuzzy match to mean something.
			fuzzy: (term) => (term.length >= 5 ? 0.2 : false),
			combineWith: 'AND'
		}
	});
}

export class CentreSearch {
	private index = createIndex();
	private revision = -1;
	private refreshing: Promise<void> | null = null;

	/** Folds centres changed since the last look into the index. */
	async ensureCurrent(db: Kysely<Database>): Promise<void> {
		while (this.refreshing) await this.refreshing;
		const state = await db
			.selectFrom('catalogue_state')
			.select('revision')
			.where('id', '=', 1)
			.executeTakeFirstOrThrow();
		if (state.revision === this.revision) return;
		this.refreshing = this.refresh(db, state.revision).finally(() => {
			this.refreshing = null;
		});
		await this.refreshing;
	}

	private async refresh(db: Kysely<Database>, target: number): Promise<void> {
		const rows = await db
			.selectFrom('centre as c')
			.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
			.innerJoin('protein as p', 'p.entry_id', 'c.protein_entry_id')
			.innerJoin('entry as pe', 'pe.id', 'p.entry_id')
			.select([
				'c.entry_id as id',
				'ce.accession',
				'c.label',
				'c.cofactor_kind',
				'c.ligation',
				'p.name',
				'p.organism',
				'pe.accession as proteinAccession'
			])
			.where('c.revision', '>', this.revision)
			.execute();
		const documents = rows.map(
			(r): CentreDocument => ({
				id: r.id,
				accession: r.accession,
				label: r.label,
				kind: `${COFACTOR_KIND_LABELS[r.cofactor_kind as CofactorKind] ?? r.cofactor_kind} ${r.cofactor_kind}`,
				ligation: r.ligation ?? '',
				protein: r.name,
				proteinAccession: r.proteinAccession,
				organism: r.organism
			})
		);
		if (this.revision < 0) {
			this.index.addAll(documents);
		} else {
			for (const doc of documents) {
				if (this.index.has(doc.id)) this.index.replace(doc);
				else this.index.add(doc);
			}
		}
		this.revision = target;
	}

	/** Centre entry ids matching the text, best first. */
	search(query: string): number[] {
		return this.index.search(query).map((r) => r.id as number);
	}

	get documentCount(): number {
		return this.index.documentCount;
	}
}

/** One index per server process: it holds only public-catalogue text, never per-user state. */
export const centreSearch = new CentreSearch();
