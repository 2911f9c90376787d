import type { Kysely } from 'kysely';
import { setImmediate } from 'node:timers/promises';
import type { CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { entryIsVisible, potentialIsVisible, type Viewer } from '../catalogue/visibility';

/*
 * What a CSV check needs to know about the registry, read once per file rather than once per
 * row: the approved proteins, centres and sources the uploader may see, and the approved values
 * a new row could repeat or contradict.
 */
export interface CentreFact {
	accession: string;
	entryId: number;
	proteinEntryId: number;
	label: string;
	cofactorKind: CofactorKind;
}

export interface ApprovedPotential {
	accession: string;
	couple: string;
	emMvShe: number;
	uncertaintyMv: number | null;
	ph: number | null;
	temperatureK: number | null;
	method: string;
}

export interface UploadLookups {
	centresByAccession: Map<string, CentreFact>;
	/** `${proteinEntryId}|${label lower-case}` → centre. */
	centresByProteinLabel: Map<string, CentreFact>;
	proteinsByAccession: Map<string, { entryId: number; name: string }>;
	/** Lower-case name → proteins of that name (several organisms may share one). */
	proteinsByName: Map<string, { accession: string; entryId: number }[]>;
	sources: Set<string>;
	potentialsByCentreCouple: Map<string, ApprovedPotential[]>;
	spinKeys: Map<string, string>;
	distanceKeys: Map<string, string>;
}

export const centreLabelKey = (proteinEntryId: number, label: string) =>
	`${proteinEntryId}|${label.trim().toLowerCase()}`;
export const spinKey = (centre: string, level: string, method: string, t: number | null) =>
	`${centre}|${level}|${method}|${t ?? ''}`;
export const distanceKey = (a: string, b: string, structure: string) =>
	`${a < b ? a : b}|${a < b ? b : a}|${structure.toLowerCase()}`;

const PAGE = 5000;

/**
 * All rows of a query, read a page at a time in entry-id order with a pause between pages, so
 * that reading a large catalogue never holds the event loop for long.
 */
async function paged<T extends { entry_id: number }>(
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

	// Duplicates and conflicts are judged only against values the uploader may see: a message
	// naming a hidden value (or a count including one) would give it away. Curators compare with
	// every approved value on the review page.
	const potentialsByCentreCouple = new Map<string, ApprovedPotential[]>();
	await paged(
		(after) =>
			db
				.selectFrom('potential')
				.select([
					'entry_id',
					'accession',
					'centre_accession',
					'couple',
					'em_mv_she',
					'uncertainty_mv',
					'ph',
					'temperature_k',
					'method'
				])
				.where('entry_id', '>', after)
				.where((eb) => potentialIsVisible(eb, 'potential', viewer))
				.orderBy('entry_id')
				.limit(PAGE)
				.execute(),
		(p) => {
			const key = `${p.centre_accession}|${p.couple}`;
			const list = potentialsByCentreCouple.get(key) ?? [];
			list.push({
				accession: p.accession,
				couple: p.couple,
				emMvShe: p.em_mv_she,
				uncertaintyMv: p.uncertainty_mv,
				ph: p.ph,
				temperatureK: p.temperature_k,
				method: p.method
			});
			potentialsByCentreCouple.set(key, list);
		}
	);

	const accessionOf = new Map(centres.map((c) => [c.entry_id, c.accession]));
	const spinKeys = new Map<string, string>();
	const spins = await paged((after) =>
		db
			.selectFrom('spin_record')
			.innerJoin('entry', 'entry.id', 'spin_record.entry_id')
			.select([
				'spin_record.entry_id',
				'entry.accession',
				'spin_record.centre_entry_id',
				'spin_record.oxidation_level',
				'spin_record.method',
				'spin_record.temperature_k'
			])
			.where('spin_record.entry_id', '>', after)
			.where((eb) => entryIsVisible(eb, 'entry', viewer))
			.orderBy('spin_record.entry_id')
			.limit(PAGE)
			.execute()
	);
	for (const s of spins) {
		const centre = accessionOf.get(s.centre_entry_id) ?? '';
		spinKeys.set(spinKey(centre, s.oxidation_level, s.method, s.temperature_k), s.accession);
	}
	const distanceKeys = new Map<string, string>();
	const distances = await paged((after) =>
		db
			.selectFrom('distance')
			.innerJoin('entry', 'entry.id', 'distance.entry_id')
			.select([
				'distance.entry_id',
				'entry.accession',
				'distance.centre_a_entry_id',
				'distance.centre_b_entry_id',
				'distance.structure_id'
			])
			.where('distance.entry_id', '>', after)
			.where((eb) => entryIsVisible(eb, 'entry', viewer))
			.orderBy('distance.entry_id')
			.limit(PAGE)
			.execute()
	);
	for (const d of distances) {
		distanceKeys.set(
			distanceKey(
				accessionOf.get(d.centre_a_entry_id) ?? '',
				accessionOf.get(d.centre_b_entry_id) ?? '',
				d.structure_id
			),
			d.accession
		);
	}

	return {
		centresByAccession,
		centresByProteinLabel,
		proteinsByAccession,
		proteinsByName,
		sources,
		potentialsByCentreCouple,
		spinKeys,
		distanceKeys
	};
}
