import { upsertReadModel, type KindOnServer } from './kind';
import type { SourceKind } from '$lib/schemas/vocabulary';
import type { JsonColumn } from '../db/json';

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface SourceTable {
	entry_id: number;
	version: number;
	source_kind: SourceKind;
	doi: string | null;
	pubmed_id: string | null;
	title: string;
	/** JSON array of author names as "Family, Given". */
	authors: JsonColumn<string[]>;
	journal: string | null;
	year: number | null;
}

declare module '../db/schema' {
	interface KindTables {
		source: SourceTable;
	}
}

export const source: KindOnServer<'source'> = {
	async project(trx, { entryId, version, data: d }) {
		await upsertReadModel(trx, 'source', entryId, {
			version,
			source_kind: d.sourceKind,
			doi: d.doi,
			pubmed_id: d.pubmedId,
			title: d.title,
			authors: JSON.stringify(d.authors),
			journal: d.journal,
			year: d.year
		});
	},
	// A source the reader may not see is left out where it is named; it hides nothing else.
	dependsOn: async () => [],
	title(d) {
		const first = (d.authors[0] ?? '').split(',')[0];
		return `${first}${d.authors.length > 1 ? ' et al.' : ''}${d.year ? ` (${d.year})` : ''}: ${d.title}`;
	},
	potentialRowsColumn: null
};
