import type { Kysely } from 'kysely';
import { referencesOf } from '$lib/kinds';
import type { EntryData } from '$lib/schemas/entryData';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
import { bumpCatalogueRevision } from '../db/revision';
import { resolveReference } from './references';
import { latestApprovedVersionNumber } from './latestVersion';

/** The approved version being projected: its row and its number. */
export interface ApprovedVersionId {
	versionId: number;
	entryId: number;
	version: number;
}

/**
 * Writes the read model (typed columns) for the newly approved version of one entry, pins the
 * exact version each of its references resolved to (entry_version_reference, migration 0009:
 * the version's title and citation are built from those pinned versions, forever), and marks
 * what the search index must refresh. Runs inside the approving transaction.
 * @throws {InvalidEntryDataError} when a reference does not resolve or does not fit.
 */
export async function projectApprovedVersion(
	trx: Kysely<Database>,
	approved: ApprovedVersionId,
	entry: EntryData
): Promise<void> {
	const revision = await bumpCatalogueRevision(trx);
	const data = entry.data as unknown as Record<string, unknown>;
	const refs: Record<string, number | null> = {};
	const pins: { field: string; entryId: number; version: number }[] = [];
	for (const [field, kind] of Object.entries(referencesOf(entry.kind))) {
		const accession = data[field];
		if (typeof accession !== 'string') {
			refs[field] = null;
			continue;
		}
		const entryId = await resolveReference(trx, field, accession, kind);
		refs[field] = entryId;
		// resolveReference has just found an approved version of this entry.
		const version = (await latestApprovedVersionNumber(trx, entryId)) as number;
		pins.push({ field, entryId, version });
	}
	if (pins.length > 0)
		await trx
			.insertInto('entry_version_reference')
			.values(
				pins.map((p) => ({
					entry_version_id: approved.versionId,
					field: p.field,
					referenced_entry_id: p.entryId,
					referenced_version: p.version
				}))
			)
			.execute();
	await serverKind(entry.kind).project(trx, {
		entryId: approved.entryId,
		version: approved.version,
		revision,
		data: entry.data,
		refs
	});
}
