import type { Kysely } from 'kysely';
import { COUPLES_BY_KIND, type CofactorKind, type EntryKind } from '$lib/schemas/vocabulary';
import type { EntryData } from '$lib/schemas/entryData';
import type { Database } from '../db/schema';
import { InvalidEntryDataError } from './errors';
import type { Viewer } from './visibility';
import { findVisibleEntry, notVisibleMessage } from './visibleEntry';

/**
 * Who resolves a reference: a reader (contributor checking a form, a CSV row, an API body), who
 * may name only approved entries they can see; or the registry itself when approving, which
 * resolves against everything approved.
 */
export type ReferenceReader = Viewer | null | 'registry';

/**
 * Resolves an accession named in a version's data to the id of an approved entry of the
 * expected kind, or explains precisely why it cannot — without telling a reader anything about
 * an entry they may not see (see visibleEntry.ts).
 */
export async function resolveReference(
	db: Kysely<Database>,
	field: string,
	accession: string,
	expected: EntryKind,
	reader: ReferenceReader = 'registry'
): Promise<number> {
	if (reader !== 'registry') {
		const row = await findVisibleEntry(db, accession, reader);
		if (!row) throw new InvalidEntryDataError(field, notVisibleMessage(accession, expected));
		if (row.kind !== expected) {
			throw new InvalidEntryDataError(
				field,
				`${accession} is a ${row.kind}, expected a ${expected}`
			);
		}
		return row.id;
	}
	const row = await db
		.selectFrom('entry')
		.select(['id', 'kind'])
		.where('accession', '=', accession)
		.executeTakeFirst();
	if (!row) throw new InvalidEntryDataError(field, `no entry ${accession}`);
	if (row.kind !== expected) {
		throw new InvalidEntryDataError(field, `${accession} is a ${row.kind}, expected a ${expected}`);
	}
	const approved = await db
		.selectFrom('entry_version')
		.select('id')
		.where('entry_id', '=', row.id)
		.where('status', '=', 'approved')
		.executeTakeFirst();
	if (!approved) {
		throw new InvalidEntryDataError(field, `${accession} has no approved version yet`);
	}
	return row.id;
}

export async function resolveOptionalReference(
	db: Kysely<Database>,
	field: string,
	accession: string | null,
	expected: EntryKind
): Promise<number | null> {
	return accession === null ? null : resolveReference(db, field, accession, expected);
}

/** A potential's couple must be one its centre's cofactor kind can have ('other' takes any). */
export async function assertCoupleFitsCentre(
	db: Kysely<Database>,
	centreEntryId: number,
	couple: string
): Promise<void> {
	const centre = await db
		.selectFrom('centre')
		.select('cofactor_kind')
		.where('entry_id', '=', centreEntryId)
		.executeTakeFirstOrThrow();
	const allowed = COUPLES_BY_KIND[centre.cofactor_kind as CofactorKind] ?? [];
	if (allowed.length > 0 && !allowed.includes(couple)) {
		throw new InvalidEntryDataError(
			'couple',
			`"${couple}" is not a couple of a ${centre.cofactor_kind} centre; expected one of ${allowed.join(', ')}`
		);
	}
}

/** The references each kind of entry makes: field → the kind it must name. */
const REFERENCE_FIELDS: Record<EntryKind, Record<string, EntryKind>> = {
	protein: {},
	source: {},
	centre: { proteinAccession: 'protein' },
	potential: { centreAccession: 'centre', sourceAccession: 'source' },
	spin_record: { centreAccession: 'centre', sourceAccession: 'source' },
	distance: { centreAAccession: 'centre', centreBAccession: 'centre', sourceAccession: 'source' }
};

/**
 * Every reference of a version's data that would not resolve on approval (the same rules the
 * projection applies), as field errors; empty when all resolve.
 */
export async function checkEntryReferences(
	db: Kysely<Database>,
	entry: EntryData,
	reader: ReferenceReader
): Promise<Record<string, string[]>> {
	const errors: Record<string, string[]> = {};
	const data = entry.data as unknown as Record<string, unknown>;
	const ids: Record<string, number> = {};
	for (const [field, expected] of Object.entries(REFERENCE_FIELDS[entry.kind])) {
		const accession = data[field];
		if (typeof accession !== 'string') continue;
		try {
			ids[field] = await resolveReference(db, field, accession, expected, reader);
		} catch (e) {
			if (!(e instanceof InvalidEntryDataError)) throw e;
			errors[field] = [e.detail];
		}
	}
	if (entry.kind === 'potential' && ids.centreAccession !== undefined) {
		try {
			await assertCoupleFitsCentre(db, ids.centreAccession, entry.data.couple);
		} catch (e) {
			if (!(e instanceof InvalidEntryDataError)) throw e;
			errors.couple = [e.detail];
		}
	}
	return errors;
}
