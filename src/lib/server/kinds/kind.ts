import type { Insertable, Kysely } from 'kysely';
import type { EntryDataByKind, EntryKind, KINDS, UploadKind } from '$lib/kinds';
import type { Database } from '../db/schema';
import type { Viewer } from '../catalogue/visibility';
import type { UploadLookups } from '../uploads/lookups';
import type { Resolved, UploadRow } from '../uploads/rows';

// What the server knows about one kind of entry, beside what it shares with the browser
// (src/lib/kinds): how an approved version becomes its read-model row, what a reader must be
// allowed to see to see it, and how it is titled.

/** One approved version, with the entries its data names already resolved to ids. */
export interface ApprovedVersion<K extends EntryKind> {
	entryId: number;
	version: number;
	/** The catalogue revision this approval moved to (search indexes compare it). */
	revision: number;
	data: EntryDataByKind[K];
	/** Entry id of each reference field of the kind (src/lib/kinds); null where left blank. */
	refs: Record<string, number | null>;
}

/** The reference fields of kind K, each with the kind it names. */
type ReferencesOf<K extends EntryKind> = (typeof KINDS)[K]['references'];

/**
 * The data of the versions a version's references are pinned to (entry_version_reference), by
 * reference field. A field left blank, or naming an entry the reader may not see, is absent.
 */
export type PinnedData<K extends EntryKind> = {
	readonly [F in keyof ReferencesOf<K>]?: EntryDataByKind[ReferencesOf<K>[F] & EntryKind];
};

/** An entry another one depends on. */
export interface Dependency {
	id: number;
	kind: EntryKind;
}

/** Which rows of the potential read model copy columns from an entry of this kind. */
export type PotentialRowsColumn = 'entry_id' | 'centre_entry_id' | 'protein_entry_id';

/**
 * How rows of a CSV upload of this kind are checked, beside the kind's schema. `Existing` is
 * what the kind reads of the registry once per file to find duplicates and conflicts.
 */
export interface UploadRules<K extends EntryKind, Existing = unknown> {
	/**
	 * The approved entries of this kind that a row could repeat or contradict, among those the
	 * uploader may see (a message naming a hidden value, or a count including one, would give it
	 * away), read once per file.
	 */
	loadExisting?(
		db: Kysely<Database>,
		viewer: Viewer | null,
		shared: UploadLookups
	): Promise<Existing>;
	/**
	 * Fills fields the row left empty from what its cells carried besides their value (a
	 * potential's unit and electrode written in the value's cell or header).
	 */
	prepare?(r: UploadRow, extras: Record<string, string>): void;
	/** Finds the entries the row names, by accession or in words; null after failing the row. */
	resolve(r: UploadRow): Resolved | null;
	/**
	 * The kind's checks of a valid row against what it names, the rows before it and the
	 * registry (duplicates, conflicts, typical ranges); false when the row has an error.
	 */
	check(r: UploadRow, data: EntryDataByKind[K], resolved: Resolved, existing: Existing): boolean;
}

/** Declares a kind's upload rules with what `loadExisting` reads typed through to `check`. */
export const defineUpload = <K extends EntryKind, Existing = undefined>(
	rules: UploadRules<K, Existing>
): UploadRules<K, Existing> => rules;

export interface ServerKindModule<K extends EntryKind> {
	/**
	 * Writes (inserts or replaces) the read-model row of a newly approved version, and refreshes
	 * rows that copy from it. Runs inside the approving transaction; throws
	 * InvalidEntryDataError when the data does not fit what it names.
	 */
	project(trx: Kysely<Database>, approved: ApprovedVersion<K>): Promise<void>;
	/** The entries a reader must be able to see to see this one, one step away. */
	dependsOn(db: Kysely<Database>, entryId: number): Promise<Dependency[]>;
	/**
	 * A short human title of one version, from its own data and the versions its references
	 * are pinned to — never from the read model, so that a version's title never changes.
	 */
	title(data: EntryDataByKind[K], refs: PinnedData<K>): string;
	/** The potential rows that copy this entry's columns or visibility, if any. */
	potentialRowsColumn: PotentialRowsColumn | null;
	/**
	 * Checks between the data and the entries it names beyond their kinds (a potential's couple
	 * must fit its centre): throws InvalidEntryDataError. Only the resolved references are given.
	 */
	checkReferences?(
		db: Kysely<Database>,
		data: EntryDataByKind[K],
		refs: Record<string, number>
	): Promise<void>;
	/** CSV uploads of this kind (the kinds in UPLOAD_KINDS have them). */
	upload?: UploadRules<K>;
}

/** A kind's server module; the kinds that can be uploaded as CSV must say how. */
export type KindOnServer<K extends EntryKind> = ServerKindModule<K> &
	(K extends UploadKind ? { upload: UploadRules<K> } : unknown);

/** The read-model tables: one per kind, keyed by entry id. */
export type ReadModelTable = EntryKind;

/**
 * Inserts a read-model row, or replaces the one an earlier version wrote. Callers' rows are
 * checked against the table's columns; Kysely cannot follow a table name that is a type
 * parameter into `values`, hence the casts inside.
 */
export async function upsertReadModel<T extends ReadModelTable>(
	trx: Kysely<Database>,
	table: T,
	entryId: number,
	row: Omit<Insertable<Database[T]>, 'entry_id'>
): Promise<void> {
	await trx
		.insertInto(table)
		.values({ entry_id: entryId, ...row } as never)
		.onConflict((oc) => oc.column('entry_id').doUpdateSet(row as never))
		.execute();
}
