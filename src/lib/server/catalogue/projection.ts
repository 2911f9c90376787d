import type { Kysely } from 'kysely';
import { referencesOf } from '$lib/kinds';
import type { EntryData } from '$lib/schemas/entryData';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
import { bumpCatalogueRevision } from '../db/revision';
import { resolveReference } from './references';

/**
 * Writes the read model (typed columns) for the newly approved version of one entry, and
 * marks what the search index must refresh. Runs inside the approving transaction.
 * @throws {InvalidEntryDataError} when a reference does not resolve or does not fit.
 */
export async function projectApprovedVersion(
	trx: Kysely<Database>,
	entryId: number,
	version: number,
	entry: EntryData
): Promise<void> {
	const revision = await bumpCatalogueRevision(trx);
	const data = entry.data as unknown as Record<string, unknown>;
	const refs: Record<string, number | null> = {};
	for (const [field, kind] of Object.entries(referencesOf(entry.kind))) {
		const accession = data[field];
		refs[field] =
			typeof accession === 'string' ? await resolveReference(trx, field, accession, kind) : null;
	}
	await serverKind(entry.kind).project(trx, {
		entryId,
		version,
		revision,
		data: entry.data,
		refs
	});
}
