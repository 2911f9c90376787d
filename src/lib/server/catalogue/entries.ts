import type { Kysely } from 'kysely';
import { formatAccession } from '$lib/schemas/accession';
import { parseEntryData } from '$lib/schemas/entryData';
import type { EntryKind, Visibility } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
import { InvalidEntryDataError, VersionStateError } from './errors';
import { refreshPotentialRows } from './potentialRows';
import { bumpCatalogueRevision } from '../db/revision';
import { projectApprovedVersion } from './projection';
import { writeAudit } from '../audit/log';

/**
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

export async function createEntry(
	trx: Kysely<Database>,
	entry: NewEntry
): Promise<{ id: number; accession: string }> {
	// The accession is derived from the row id, which SQLite assigns; a placeholder fills the
	// NOT NULL column for the instant between insert and update inside the same transaction.
	const { id } = await trx
		.insertInto('entry')
		.values({
			accession: `pending-${crypto.randomUUID()}`,
			kind: entry.kind,
			visibility: entry.visibility ?? 'public',
			group_id: entry.groupId ?? null,
			embargo_until: entry.embargoUntil ?? null,
			is_demo: entry.isDemo ? 1 : 0,
			created_by: entry.createdBy ?? null
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	const accession = formatAccession(id);
	await trx.updateTable('entry').set({ accession }).where('id', '=', id).execute();
	return { id, accession };
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
	const entryData = parseEntryData(row.kind, JSON.parse(row.data));
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
	await projectApprovedVersion(trx, row.entry_id, version, entryData);
	await writeAudit(trx, {
		actorId: options.approvedBy ?? null,
		action: 'version.approve',
		entryId: row.entry_id,
		after: { version, versionId },
		at: approvedAt
	});
	return { entryId: row.entry_id, version };
}

export async function latestApprovedVersionNumber(
	db: Kysely<Database>,
	entryId: number
): Promise<number | null> {
	const row = await db
		.selectFrom('entry_version')
		.select((eb) => eb.fn.max('version').as('latest'))
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.executeTakeFirst();
	return row?.latest ?? null;
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
