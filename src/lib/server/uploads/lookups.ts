import type { Kysely } from 'kysely';
import { setImmediate } from 'node:timers/promises';
import type { CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { entryIsVisible, type Viewer } from '../catalogue/visibility';

/*
 * What a CSV check needs to know about the registry, read once per file rather than once per
 * row: the approved proteins, centres and sources the uploader may see. The approved values a
 * row could repeat or contradict are read by the kind's upload rules (`loadExisting`).
 */
export interface CentreFact {
	accession: string;
	entryId: number;
	proteinEntryId: number;
	label: string;
	cofactorKind: CofactorKind;
}

export interface UploadLookups {
	centresByAccession: Map<string, CentreFact>;
	/** `${proteinEntryId}|${label lower-case}` → centre. */
	centresByProteinLabel: Map<string, CentreFact>;
	proteinsByAccession: Map<string, { entryId: number; name: string }>;
	/** Lower-case name → proteins of that name (several organisms may share one). */
	proteinsByName: Map<string, { accession: string; entryId: number }[]>;
	sources: Set<string>;
}

export const centreLabelKey = (proteinEntryId: number, label: string) =>
	`${proteinEntryId}|${label.trim().toLowerCase()}`;

/** The accession of each visible centre, by entry id (read-model rows name centres by id). */
export function centreAccessionsById(lookups: UploadLookups): Map<number, string> {
	return new Map([...lookups.centresByAccession.values()].map((c) => [c.entryId, c.accession]));
}

export const PAGE = 5000;

/**
 * All rows of a query, read a page at a time in entry-id order with a pause between pages, so
 * that reading a large catalogue never holds the event loop for long.
 */
export async function paged<T extends { entry_id: number }>(
	page: (afterId: number) => Promise<T[]>,
	each: (row: T) => void = () => {}
): Promise<T[]> {
	const all: T[] = [];
	let after = 0;
	for (;;) {
		const rows = await page(after);
		for (const row of rows) {
			all.push(row);
			each(row);
		}
		if (rows.length < PAGE) return all;
		after = (rows.at(-1) as T).entry_id;
		await setImmediate();
	}
}

export async function loadUploadLookups(
	db: Kysely<Database>,
	viewer: Viewer | null
): Promise<UploadLookups> {
	const visible = <T extends 'protein' | 'centre' | 'source'>(table: T) =>
		db
			.selectFrom(table as 'protein')
			.innerJoin('entry', 'entry.id', `${table as 'protein'}.entry_id`)
			.where((eb) => entryIsVisible(eb, 'entry', viewer));

	const proteins = await paged((after) =>
		visible('protein')
			.select(['entry.accession', 'protein.entry_id', 'protein.name'])
			.where('protein.entry_id', '>', after)
			.orderBy('protein.entry_id')
			.limit(PAGE)
			.execute()
	);
	const proteinsByAccession = new Map<string, { entryId: number; name: string }>();
	const proteinsByName = new Map<string, { accession: string; entryId: number }[]>();
	for (const p of proteins) {
		proteinsByAccession.set(p.accession, { entryId: p.entry_id, name: p.name });
		const key = p.name.trim().toLowerCase();
		proteinsByName.set(key, [
			...(proteinsByName.get(key) ?? []),
			{ accession: p.accession, entryId: p.entry_id }
		]);
	}

	const centres = await paged((after) =>
		db
			.selectFrom('centre')
			.innerJoin('entry', 'entry.id', 'centre.entry_id')
			.innerJoin('entry as pe', 'pe.id', 'centre.protein_entry_id')
			// A centre is usable only with its protein: both must be visible.
			.where((eb) =>
				eb.and([entryIsVisible(eb, 'entry', viewer), entryIsVisible(eb, 'pe', viewer)])
			)
			.select([
				'entry.accession',
				'centre.entry_id',
				'centre.protein_entry_id',
				'centre.label',
				'centre.cofactor_kind'
			])
			.where('centre.entry_id', '>', after)
			.orderBy('centre.entry_id')
			.limit(PAGE)
			.execute()
	);
	const centresByAccession = new Map<string, CentreFact>();
	const centresByProteinLabel = new Map<string, CentreFact>();
	for (const c of centres) {
		const fact: CentreFact = {
			accession: c.accession,
			entryId: c.entry_id,
			proteinEntryId: c.protein_entry_id,
			label: c.label,
			cofactorKind: c.cofactor_kind
		};
		centresByAccession.set(c.accession, fact);
		centresByProteinLabel.set(centreLabelKey(c.protein_entry_id, c.label), fact);
	}

	const sources = new Set(
		(
			await db
				.selectFrom('source')
				.innerJoin('entry', 'entry.id', 'source.entry_id')
				.where((eb) => entryIsVisible(eb, 'entry', viewer))
				.select('entry.accession')
				.execute()
		).map((s) => s.accession)
	);

	return {
		centresByAccession,
		centresByProteinLabel,
		proteinsByAccession,
		proteinsByName,
		sources
	};
}
