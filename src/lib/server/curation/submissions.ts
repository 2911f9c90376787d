import type { Kysely } from 'kysely';
import { parseEntryData, type EntryData } from '$lib/schemas/entryData';
import { KINDS, type KindModule, ENTRY_KIND_LABELS } from '$lib/kinds';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import { writeAudit } from '../audit/log';
import { readJson } from '../db/json';
import type { Database, SubmissionStatus } from '../db/schema';
import {
	addVersion,
	allocateEntries,
	type AllocatedEntry,
	type VisibilityChange
} from '../catalogue/entries';
import { checkEntryReferences } from '../catalogue/references';
import { carryForward } from '../catalogue/versionAttachments';
import { findVisibleEntry, notVisibleMessage } from '../catalogue/visibleEntry';
import { viewerOf } from '../catalogue/visibility';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from './errors';
import { noticesForNewSubmission } from './notices';
import { assertPendingRoom } from './pending';
import { nextStatus } from './transitions';
import type { OutgoingMail } from './outbox';

/*
 * A contributor's side of curation: drafts (one entry version per form submission), submitting
 * for review, withdrawing, and comments. Every function runs in the caller's transaction and
 * writes the audit log; mail comes back to the caller to send after commit. Which action a
 * state allows, and the state it leads to, is `SUBMISSION_TRANSITIONS` (`transitions.ts`).
 */

export interface DraftInput {
	entry: EntryData;
	visibility: VisibilityChange;
	changeNote: string | null;
}

export async function assertGroupAllowed(
	trx: Kysely<Database>,
	user: SessionUser,
	visibility: VisibilityChange
): Promise<void> {
	if (visibility.groupId === null) return;
	const group = await trx
		.selectFrom('research_group')
		.select('id')
		.where('id', '=', visibility.groupId)
		.executeTakeFirst();
	if (!group) throw new SubmissionInvalidError({ groupId: [`no group ${visibility.groupId}`] });
	if (!roleAtLeast(user.role, 'curator') && !user.groupIds.includes(visibility.groupId)) {
		throw new SubmissionInvalidError({
			groupId: ['you can share only with a group you belong to']
		});
	}
}

/** A title a curator can scan in the queue. */
export function submissionTitle(entry: EntryData, editing: string | null): string {
	// The module is the entry's own kind's (see parseEntryData for why TypeScript needs telling).
	const what = (KINDS[entry.kind] as KindModule).submissionTitle(entry.data);
	const label = ENTRY_KIND_LABELS[entry.kind];
	return editing
		? `${label} ${editing}, new version: ${what}`
		: `New ${label.toLowerCase()}: ${what}`;
}

/**
 * Starts a submission holding one draft version: of a new entry, or (with `editAccession`) a
 * proposed new version of an approved one.
 */
export async function createDraft(
	trx: Kysely<Database>,
	user: SessionUser,
	input: DraftInput & { editAccession: string | null; pendingRowsMax: number }
): Promise<{ submissionId: number; accession: string }> {
	await assertGroupAllowed(trx, user, input.visibility);
	await assertPendingRoom(trx, user.id, 1, input.pendingRowsMax);
	let entry: AllocatedEntry;
	if (input.editAccession) {
		// Only an approved entry the user may see can get a proposed new version; anything else
		// (unknown, hidden, or someone's pending accession) is answered alike.
		const existing = await findVisibleEntry(trx, input.editAccession, viewerOf(user));
		if (!existing) {
			throw new SubmissionInvalidError({ entry: [notVisibleMessage(input.editAccession)] });
		}
		if (existing.kind !== input.entry.kind) {
			throw new SubmissionInvalidError({
				entry: [`${input.editAccession} is a ${existing.kind}, not a ${input.entry.kind}`]
			});
		}
		entry = existing;
	} else {
		const [created] = await allocateEntries(trx, [{ kind: input.entry.kind, createdBy: user.id }]);
		entry = created as AllocatedEntry;
	}
	const { id: submissionId } = await trx
		.insertInto('submission')
		.values({
			channel: 'form',
			status: 'draft',
			title: submissionTitle(input.entry, input.editAccession ? entry.accession : null),
			submitted_by: user.id,
			content_sha256: null,
			row_count: 1,
			submitted_at: null
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	const versionId = await addVersion(trx, entry.id, input.entry.data, {
		status: 'draft',
		submissionId,
		createdBy: user.id,
		changeNote: input.changeNote,
		visibility: input.visibility
	});
	// A proposed change starts with the files of the version it changes; the contributor may
	// remove them from the proposal (never from the approved version, whose list is frozen).
	if (input.editAccession) {
		const base = await trx
			.selectFrom('entry_version')
			.select('id')
			.where('entry_id', '=', entry.id)
			.where('status', '=', 'approved')
			.orderBy('version', 'desc')
			.limit(1)
			.executeTakeFirst();
		if (base) await carryForward(trx, base.id, versionId);
	}
	await writeAudit(trx, {
		actorId: user.id,
		action: 'submission.create',
		entryId: entry.id,
		submissionId,
		after: { data: input.entry.data, visibility: input.visibility }
	});
	return { submissionId, accession: entry.accession };
}

/** The submission, checked to belong to `user` (curators act through reviews, not here). */
export async function loadOwnSubmission(
	trx: Kysely<Database>,
	user: SessionUser,
	submissionId: number
) {
	const submission = await trx
		.selectFrom('submission')
		.selectAll()
		.where('id', '=', submissionId)
		.executeTakeFirst();
	if (!submission) throw new SubmissionNotFoundError(submissionId);
	if (submission.submitted_by !== user.id) {
		throw new SubmissionAccessError('this submission belongs to another contributor');
	}
	return submission;
}

async function formVersion(trx: Kysely<Database>, submissionId: number) {
	return trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select([
			'entry_version.id',
			'entry_version.data',
			'entry_version.visibility',
			'entry_version.group_id',
			'entry_version.embargo_until',
			'entry_version.change_note',
			'entry_version.based_on_version',
			'entry.id as entryId',
			'entry.kind',
			'entry.accession'
		])
		.where('entry_version.submission_id', '=', submissionId)
		.orderBy('entry_version.id')
		.execute();
}

/** Replaces the data of a draft or returned submission's version. */
export async function updateDraft(
	trx: Kysely<Database>,
	user: SessionUser,
	submissionId: number,
	input: DraftInput
): Promise<void> {
	const submission = await loadOwnSubmission(trx, user, submissionId);
	nextStatus(submission.status, 'edit', submissionId);
	await assertGroupAllowed(trx, user, input.visibility);
	const [version] = await formVersion(trx, submissionId);
	if (!version) throw new SubmissionStateError(`submission ${submissionId} holds no version`);
	if (version.kind !== input.entry.kind) {
		throw new SubmissionInvalidError({ entry: [`this submission holds a ${version.kind}`] });
	}
	await trx
		.updateTable('entry_version')
		.set({
			data: JSON.stringify(input.entry.data),
			change_note: input.changeNote,
			visibility: input.visibility.visibility,
			group_id: input.visibility.groupId,
			embargo_until: input.visibility.embargoUntil
		})
		.where('id', '=', version.id)
		.execute();
	const editing = version.based_on_version !== null ? version.accession : null;
	await trx
		.updateTable('submission')
		.set({ title: submissionTitle(input.entry, editing), updated_at: new Date().toISOString() })
		.where('id', '=', submissionId)
		.execute();
	await writeAudit(trx, {
		actorId: user.id,
		action: 'submission.edit',
		entryId: version.entryId,
		submissionId,
		before: { data: readJson(version.data), visibility: version.visibility },
		after: { data: input.entry.data, visibility: input.visibility }
	});
}

async function setStatus(
	trx: Kysely<Database>,
	submissionId: number,
	status: SubmissionStatus,
	versionStatus: 'draft' | 'submitted' | 'returned' | 'rejected' | 'withdrawn'
) {
	const now = new Date().toISOString();
	await trx
		.updateTable('submission')
		.set({ status, updated_at: now, ...(status === 'submitted' ? { submitted_at: now } : {}) })
		.where('id', '=', submissionId)
		.execute();
	await trx
		.updateTable('entry_version')
		.set({ status: versionStatus })
		.where('submission_id', '=', submissionId)
		.where('status', '!=', 'approved')
		.execute();
}

/**
 * Sends a draft (or a returned submission, fixed) to the curators. Every reference must resolve
 * now, so a curator never sees a submission that cannot be approved for that reason.
 */
export async function submitForReview(
	trx: Kysely<Database>,
	user: SessionUser,
	submissionId: number,
	origin: string
): Promise<{ mails: OutgoingMail[] }> {
	const submission = await loadOwnSubmission(trx, user, submissionId);
	const status = nextStatus(submission.status, 'submit', submissionId);
	for (const v of await formVersion(trx, submissionId)) {
		const errors = await checkEntryReferences(
			trx,
			parseEntryData(v.kind, readJson(v.data)),
			viewerOf(user)
		);
		if (Object.keys(errors).length > 0) throw new SubmissionInvalidError(errors);
	}
	await setStatus(trx, submissionId, status, 'submitted');
	await writeAudit(trx, {
		actorId: user.id,
		action: submission.status === 'returned' ? 'submission.resubmit' : 'submission.submit',
		submissionId,
		before: { status: submission.status },
		after: { status }
	});
	return {
		mails: await noticesForNewSubmission(trx, { ...submission, status }, origin)
	};
}

/** Takes a submission back before a decision; its versions stay on record as withdrawn. */
export async function withdrawSubmission(
	trx: Kysely<Database>,
	user: SessionUser,
	submissionId: number
): Promise<void> {
	const submission = await loadOwnSubmission(trx, user, submissionId);
	const status = nextStatus(submission.status, 'withdraw', submissionId);
	// A batch a curator is approving chunk by chunk already has approved rows: it is being
	// decided, and withdrawing half of it would leave approved rows under a withdrawn batch.
	const approved = await trx
		.selectFrom('entry_version')
		.select('id')
		.where('submission_id', '=', submissionId)
		.where('status', '=', 'approved')
		.limit(1)
		.executeTakeFirst();
	if (approved) {
		throw new SubmissionStateError(
			`submission ${submissionId} is being approved and can no longer be withdrawn`
		);
	}
	await setStatus(trx, submissionId, status, 'withdrawn');
	await writeAudit(trx, {
		actorId: user.id,
		action: 'submission.withdraw',
		submissionId,
		before: { status: submission.status },
		after: { status }
	});
}

export { setStatus as setSubmissionStatus, formVersion as submissionVersions };
