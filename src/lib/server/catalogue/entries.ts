import { sql, type Kysely } from 'kysely';
import { formatAccession } from '$lib/schemas/accession';
import { parseEntryData } from '$lib/schemas/entryData';
import type { Visibility } from '$lib/schemas/vocabulary';
import type { EntryKind } from '$lib/kinds';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
import { InvalidEntryDataError, VersionStateError } from './errors';
import { refreshPotentialRows } from './potentialRows';
import { bumpCatalogueRevision } from '../db/revision';
import { projectApprovedVersion } from './projection';
import { latestApprovedVersionNumber } from './latestVersion';
import { writeAudit } from '../audit/log';
import { setImmediate } from 'node:timers/promises';

/*
 * Writing entries and versions. An entry gets its accession when created; its versions are
 * numbered when approved, and an approved version is never changed again (the database
 * enforces this with triggers). Callers pass a transaction: these functions never open one.
 */

export interface NewEntry {
	kind: EntryKind;
	visibility?: Visibility;
	groupId?: number | null;
	embargoUntil?: string | null;
	isDemo?: boolean;
	createdBy?: string | null;
}

/** An entry as created: its row id and its accession. */
export interface AllocatedEntry {
	id: number;
	accession: string;
}

/** Entry rows per multi-row insert: 500 × 9 columns stays far below SQLite's 32 766 parameters. */
const ALLOCATE_CHUNK_ROWS = 500;

/**
 * Creates one entry row for each of `entries`, in order, each with its final accession, and
 * returns their ids and accessions. The one way entries are made: the form path, the CSV commit
 * and the seed all come here. Ids are handed out here rather than by SQLite so that each row's
 * accession (derived from its id by `formatAccession`, which widens past HL999999) goes into
 * the same insert as the row: no placeholder accession is ever written. The next id follows
 * the highest ever handed out (`sqlite_sequence`: ids of withdrawn drafts are never reused).
 * Must run in the writing transaction, which holds SQLite's write lock from the first
 * statement (transactions begin IMMEDIATE), so nobody can take the same ids meanwhile; between
 * chunks of a large batch it lets the event loop go.
 * @throws {Error} when not given a transaction (a programming error).
 */
export async function allocateEntries(
	trx: Kysely<Database>,
	entries: readonly NewEntry[]
): Promise<AllocatedEntry[]> {
	if (!trx.isTransaction) {
		throw new Error('allocateEntries must run inside the transaction that writes the entries');
	}
	if (entries.length === 0) return [];
	const last = await sql<{ seq: number }>`select max(
			coalesce((select seq from sqlite_sequence where name = 'entry'), 0),
			coalesce((select max(id) from entry), 0)
		) as seq`.execute(trx);
	const first = Number(last.rows[0]?.seq ?? 0) + 1;
	const allocated = entries.map((_, i) => ({
		id: first + i,
		accession: formatAccession(first + i)
	}));
	for (let start = 0; start < entries.length; start += ALLOCATE_CHUNK_ROWS) {
		if (start > 0) await setImmediate();
		await trx
			.insertInto('entry')
			.values(
				entries.slice(start, start + ALLOCATE_CHUNK_ROWS).map((entry, j) => {
					const { id, accession } = allocated[start + j] as AllocatedEntry;
					return {
						id,
						accession,
						kind: entry.kind,
						visibility: entry.visibility ?? 'public',
						group_id: entry.groupId ?? null,
						embargo_until: entry.embargoUntil ?? null,
						is_demo: entry.isDemo ? 1 : 0,
						created_by: entry.createdBy ?? null,
						merged_into_entry_id: null
					};
				})
			)
			.execute();
	}
	return allocated;
}

/** One new entry (see `allocateEntries`), in the caller's transaction. */
export async function createEntry(trx: Kysely<Database>, entry: NewEntry): Promise<AllocatedEntry> {
	const [created] = await allocateEntries(trx, [entry]);
	return created as AllocatedEntry;
}

export interface NewVersion {
	status: 'draft' | 'submitted';
	submissionId?: number | null;
	createdBy?: string | null;
	changeNote?: string | null;
	/** The visibility the version asks for, applied to the entry on approval; null keeps it. */
	visibility?: VisibilityChange | null;
}

/** Adds an unapproved version (draft or submitted) after validating its data for the kind. */
export async function addVersion(
	trx: Kysely<Database>,
	entryId: number,
	data: unknown,
	options: NewVersion
): Promise<number> {
	const entry = await trx
		.selectFrom('entry')
		.select('kind')
		.where('id', '=', entryId)
		.executeTakeFirstOrThrow();
	const parsed = parseEntryData(entry.kind, data);
	const latest = await latestApprovedVersionNumber(trx, entryId);
	const { id } = await trx
		.insertInto('entry_version')
		.values({
			entry_id: entryId,
			version: null,
			status: options.status,
			data: JSON.stringify(parsed.data),
			change_note: options.changeNote ?? null,
			submission_id: options.submissionId ?? null,
			based_on_version: latest,
			created_by: options.createdBy ?? null,
			visibility: options.visibility?.visibility ?? null,
			group_id: options.visibility?.groupId ?? null,
			embargo_until: options.visibility?.embargoUntil ?? null
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	return id;
}

/**
 * Approves a submitted version: numbers it (latest + 1), freezes it, updates the read model and
 * the search revision, and writes the audit log — all in the caller's transaction.
 * @throws {VersionStateError} when the version is not awaiting approval.
 * @throws {InvalidEntryDataError} when its references do not resolve.
 */
export async function approveVersion(
	trx: Kysely<Database>,
	versionId: number,
	options: { approvedBy?: string | null; approvedAt?: string } = {}
): Promise<{ entryId: number; version: number }> {
	const row = await trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select([
			'entry_version.entry_id',
			'entry_version.status',
			'entry_version.data',
			'entry_version.visibility',
			'entry_version.group_id',
			'entry_version.embargo_until',
			'entry.kind'
		])
		.where('entry_version.id', '=', versionId)
		.executeTakeFirst();
	if (!row) throw new VersionStateError(`no entry version with id ${versionId}`);
	if (row.status !== 'submitted') {
		throw new VersionStateError(`version ${versionId} is ${row.status}, not submitted`);
	}
	const entryData = parseEntryData(row.kind, readJson(row.data));
	const version = ((await latestApprovedVersionNumber(trx, row.entry_id)) ?? 0) + 1;
	const approvedAt = options.approvedAt ?? new Date().toISOString();
	if (row.visibility !== null) {
		// The entry takes the visibility its newest approved version asked for.
		await setEntryVisibility(
			trx,
			row.entry_id,
			{ visibility: row.visibility, groupId: row.group_id, embargoUntil: row.embargo_until },
			options.approvedBy ?? null
		);
	}
	await trx
		.updateTable('entry_version')
		.set({
			status: 'approved',
			version,
			approved_by: options.approvedBy ?? null,
			approved_at: approvedAt
		})
		.where('id', '=', versionId)
		.execute();
	await projectApprovedVersion(trx, { versionId, entryId: row.entry_id, version }, entryData);
	await writeAudit(trx, {
		actorId: options.approvedBy ?? null,
		action: 'version.approve',
		entryId: row.entry_id,
		after: { version, versionId },
		at: approvedAt
	});
	return { entryId: row.entry_id, version };
}

export interface VisibilityChange {
	visibility: Visibility;
	groupId: number | null;
	embargoUntil: string | null;
}

/**
 * Changes who may see an entry and brings every read-model row that depends on it in step,
 * in the caller's transaction. Embargoed entries need a date; group-only ones a group.
 * @throws {InvalidEntryDataError} when the combination is incomplete.
 */
export async function setEntryVisibility(
	trx: Kysely<Database>,
	entryId: number,
	change: VisibilityChange,
	actorId: string | null = null
): Promise<void> {
	if (change.visibility === 'embargoed' && !change.embargoUntil) {
		throw new InvalidEntryDataError(
			'embargoUntil',
			'an embargoed entry needs the date it becomes public'
		);
	}
	if (change.visibility === 'group' && change.groupId === null) {
		throw new InvalidEntryDataError('groupId', 'a group-only entry needs its group');
	}
	const before = await trx
		.selectFrom('entry')
		.select(['kind', 'visibility', 'group_id', 'embargo_until'])
		.where('id', '=', entryId)
		.executeTakeFirstOrThrow();
	if (
		before.visibility === change.visibility &&
		before.group_id === change.groupId &&
		before.embargo_until === change.embargoUntil
	)
		return;
	await trx
		.updateTable('entry')
		.set({
			visibility: change.visibility,
			group_id: change.groupId,
			embargo_until: change.embargoUntil
		})
		.where('id', '=', entryId)
		.execute();
	const column = serverKind(before.kind).potentialRowsColumn;
	if (column) await refreshPotentialRows(trx, { column, entryId });
	await bumpCatalogueRevision(trx);
	await writeAudit(trx, {
		actorId,
		action: 'entry.visibility',
		entryId,
		before,
		after: change
	});
}
