import type { Kysely } from 'kysely';
import type { EntryView } from '$lib/catalogue/dto';
import { diffEntryData, type FieldChange } from '$lib/catalogue/diff';
import { readJson } from '../db/json';
import type { Database, EntryKind } from '../db/schema';
import { serverKind } from '../kinds';
import { EntryNotFoundError } from './errors';
import type { Viewer } from './visibility';
import { findVisibleEntry } from './visibleEntry';

/* Reading one entry at one approved version, as permalinks show it. */

async function findEntryOrThrow(db: Kysely<Database>, accession: string, viewer: Viewer | null) {
	const entry = await findVisibleEntry(db, accession, viewer);
	if (!entry) throw new EntryNotFoundError(accession);
	return entry;
}

/** How many versions an entry page lists (the newest); older ones stay at their permalinks. */
export const VERSIONS_LISTED = 100;

/** The newest VERSIONS_LISTED approved versions, oldest first, without their data. */
async function listedVersions(db: Kysely<Database>, entryId: number) {
	const newest = await db
		.selectFrom('entry_version')
		.select(['version', 'approved_at', 'change_note'])
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.orderBy('version', 'desc')
		.limit(VERSIONS_LISTED)
		.execute();
	return newest.reverse();
}

/** One approved version with its data, or undefined. */
async function approvedVersion(db: Kysely<Database>, entryId: number, version: number) {
	return db
		.selectFrom('entry_version')
		.select(['version', 'approved_at', 'change_note', 'data'])
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.where('version', '=', version)
		.executeTakeFirst();
}

/**
 * The entry at `version` (latest approved when omitted), with its version history and the
 * entries its data refers to.
 * @throws {EntryNotFoundError} for an unknown or invisible accession, or a missing version.
 */
export async function getEntryView(
	db: Kysely<Database>,
	accession: string,
	version: number | undefined,
	viewer: Viewer | null
): Promise<EntryView> {
	const entry = await findEntryOrThrow(db, accession, viewer);
	const versions = await listedVersions(db, entry.id);
	const latest = versions.at(-1);
	if (!latest) throw new EntryNotFoundError(accession);
	const chosen = await approvedVersion(db, entry.id, version ?? (latest.version as number));
	if (!chosen) throw new EntryNotFoundError(accession, version);
	const data = readJson(chosen.data);

	const references: EntryView['references'] = {};
	for (const [field, value] of Object.entries(data)) {
		if (!field.endsWith('Accession') || typeof value !== 'string') continue;
		const ref = await findVisibleEntry(db, value, viewer);
		if (!ref) {
			// A reference the reader may not see reads as no reference: its accession would
			// reveal that a hidden entry exists.
			data[field] = null;
			continue;
		}
		references[field] = {
			accession: value,
			kind: ref.kind,
			title: await serverKind(ref.kind).title(db, ref.id)
		};
	}

	return {
		accession,
		kind: entry.kind,
		visibility: entry.visibility,
		isDemo: entry.is_demo === 1,
		version: chosen.version as number,
		latestVersion: latest.version as number,
		approvedAt: chosen.approved_at ?? '',
		changeNote: chosen.change_note,
		data,
		versions: versions.map((v) => ({
			version: v.version as number,
			approvedAt: v.approved_at ?? '',
			changeNote: v.change_note
		})),
		references,
		title: await serverKind(entry.kind).title(db, entry.id)
	};
}

/**
 * What changed from one approved version to another.
 * @throws {EntryNotFoundError} when the entry or either version does not exist.
 */
export async function compareVersions(
	db: Kysely<Database>,
	accession: string,
	from: number,
	to: number,
	viewer: Viewer | null
): Promise<{ kind: EntryKind; changes: FieldChange[]; from: number; to: number }> {
	const entry = await findEntryOrThrow(db, accession, viewer);
	const a = await approvedVersion(db, entry.id, from);
	const b = await approvedVersion(db, entry.id, to);
	if (!a) throw new EntryNotFoundError(accession, from);
	if (!b) throw new EntryNotFoundError(accession, to);
	return {
		kind: entry.kind,
		changes: diffEntryData(readJson(a.data), readJson(b.data)),
		from,
		to
	};
}
