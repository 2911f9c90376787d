import type { Kysely } from 'kysely';
import { referencesOf, type EntryKind } from '$lib/kinds';
import type { EntryData } from '$lib/schemas/entryData';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
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
	for (const [field, expected] of Object.entries(referencesOf(entry.kind))) {
		const accession = data[field];
		if (typeof accession !== 'string') continue;
		try {
			ids[field] = await resolveReference(db, field, accession, expected, reader);
		} catch (e) {
			if (!(e instanceof InvalidEntryDataError)) throw e;
			errors[field] = [e.detail];
		}
	}
	try {
		await serverKind(entry.kind).checkReferences?.(db, entry.data, ids);
	} catch (e) {
		if (!(e instanceof InvalidEntryDataError)) throw e;
		errors[e.field] = [e.detail];
	}
	return errors;
}
