import type { Kysely } from 'kysely';
import type { EntryView } from '$lib/catalogue/dto';
import { diffEntryData, type FieldChange } from '$lib/catalogue/diff';
import { readJson } from '../db/json';
import type { Database, EntryKind } from '../db/schema';
import { referencesOf } from '$lib/kinds';
import { versionTitle } from '../kinds';
import { EntryNotFoundError } from './errors';
import type { Viewer } from './visibility';
import { findVisibleEntry } from './visibleEntry';
import { latestApprovedVersionNumber } from './latestVersion';

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
		.select(['id', 'version', 'approved_at', 'change_note', 'data'])
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.where('version', '=', version)
		.executeTakeFirst();
}

/** A reference of an approved version, at the version it was approved against. */
export interface Pin {
	field: string;
	accession: string;
	kind: EntryKind;
	entryId: number;
	version: number;
	/** The pinned version's row id and data. */
	versionId: number;
	data: Record<string, unknown>;
}

/** The pinned references of approved versions, by version id (entry_version_reference). */
export async function pinsOf(
	db: Kysely<Database>,
	versionIds: number[]
): Promise<Map<number, Pin[]>> {
	const byVersion = new Map<number, Pin[]>();
	if (versionIds.length === 0) return byVersion;
	const rows = await db
		.selectFrom('entry_version_reference as r')
		.innerJoin('entry as e', 'e.id', 'r.referenced_entry_id')
		.innerJoin('entry_version as v', (join) =>
			join
				.onRef('v.entry_id', '=', 'r.referenced_entry_id')
				.onRef('v.version', '=', 'r.referenced_version')
		)
		.select([
			'r.entry_version_id',
			'r.field',
			'r.referenced_entry_id',
			'r.referenced_version',
			'e.accession',
			'e.kind',
			'v.id as version_id',
			'v.data'
		])
		.where('r.entry_version_id', 'in', versionIds)
		.execute();
	for (const r of rows) {
		const pins = byVersion.get(r.entry_version_id) ?? [];
		pins.push({
			field: r.field,
			accession: r.accession,
			kind: r.kind,
			entryId: r.referenced_entry_id,
			version: r.referenced_version,
			versionId: r.version_id,
			data: readJson(r.data)
		});
		byVersion.set(r.entry_version_id, pins);
	}
	return byVersion;
}

/** The latest approved version of each entry, by entry id. */
async function latestVersions(db: Kysely<Database>, entryIds: number[]) {
	if (entryIds.length === 0) return new Map<number, number>();
	const rows = await db
		.selectFrom('entry_version')
		.select(['entry_id', (eb) => eb.fn.max('version').as('latest')])
		.where('entry_id', 'in', entryIds)
		.where('status', '=', 'approved')
		.groupBy('entry_id')
		.execute();
	return new Map(rows.map((r) => [r.entry_id, r.latest as number]));
}

const dataByField = (pins: readonly Pin[]) =>
	Object.fromEntries(pins.map((p) => [p.field, p.data]));

/**
 * The accession and latest approved version of an entry the viewer may see, without the rest of
 * its view (for redirects to the latest version).
 * @throws {EntryNotFoundError} for an unknown or invisible accession.
 */
export async function latestVisibleVersion(
	db: Kysely<Database>,
	accession: string,
	viewer: Viewer | null
): Promise<{ accession: string; version: number }> {
	const entry = await findEntryOrThrow(db, accession, viewer);
	const version = await latestApprovedVersionNumber(db, entry.id);
	if (version === null) throw new EntryNotFoundError(accession);
	return { accession: entry.accession, version };
}

/**
 * The entry at `version` (latest approved when omitted): the version as it was approved — its
 * data, its references at the versions they were pinned to on approval, and a title made of
 * those alone — and beside it what is true of the entry now (latest version, history,
 * visibility, newer versions of what it names).
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

	// Who may see what is a question of now (visibility.ts): a reference the reader may not see
	// reads as no reference, since its accession would reveal that a hidden entry exists.
	const seen = new Map<string, boolean>();
	const visible = async (ref: string) => {
		if (!seen.has(ref)) seen.set(ref, (await findVisibleEntry(db, ref, viewer)) !== null);
		return seen.get(ref) === true;
	};
	const onlyVisible = async (pins: readonly Pin[]) => {
		const kept: Pin[] = [];
		for (const p of pins) if (await visible(p.accession)) kept.push(p);
		return kept;
	};

	const pins = await onlyVisible((await pinsOf(db, [chosen.id])).get(chosen.id) ?? []);
	const pinned = new Map(pins.map((p) => [p.field, p]));
	for (const field of Object.keys(referencesOf(entry.kind))) {
		const value = data[field];
		if (typeof value !== 'string' || pinned.has(field)) continue;
		// Hidden now (or, for a version no pin was found for, hidden or left as written).
		if (!(await visible(value))) data[field] = null;
	}
	// The referenced versions' own pins title them (a centre: with its protein's name then).
	const nested = await pinsOf(
		db,
		pins.map((p) => p.versionId)
	);
	const references: EntryView['references'] = {};
	for (const p of pins) {
		references[p.field] = {
			accession: p.accession,
			kind: p.kind,
			version: p.version,
			title: versionTitle(
				p.kind,
				p.data,
				dataByField(await onlyVisible(nested.get(p.versionId) ?? []))
			)
		};
	}
	const current = await latestVersions(
		db,
		pins.map((p) => p.entryId)
	);
	const newerReferences: Record<string, number> = {};
	for (const p of pins) {
		const now = current.get(p.entryId);
		if (now !== undefined && now > p.version) newerReferences[p.field] = now;
	}

	return {
		accession,
		kind: entry.kind,
		isDemo: entry.is_demo === 1,
		version: chosen.version as number,
		approvedAt: chosen.approved_at ?? '',
		changeNote: chosen.change_note,
		data,
		references,
		title: versionTitle(entry.kind, readJson(chosen.data), dataByField(pins)),
		live: {
			latestVersion: latest.version as number,
			versions: versions.map((v) => ({
				version: v.version as number,
				approvedAt: v.approved_at ?? '',
				changeNote: v.change_note
			})),
			visibility: entry.visibility,
			newerReferences
		}
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
