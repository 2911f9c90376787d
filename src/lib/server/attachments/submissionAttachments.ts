import type { Kysely } from 'kysely';
import { DomainError } from '$lib/domainError';
import type { AttachmentMeta } from '$lib/schemas/attachment';
import type { ApiErrorCode } from '$lib/schemas/apiError';
import type { SubmissionView, SubmissionWithFiles } from '$lib/schemas/curationResponses';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import { writeAudit } from '../audit/log';
import { findVisibleEntry } from '../catalogue/visibleEntry';
import { viewerOf } from '../catalogue/visibility';
import { config } from '../config';
import type { Database } from '../db/schema';
import {
	attachmentsOfVersion,
	createAttachment,
	listOnVersion,
	unlistFromVersion,
	type AttachmentDeps,
	type AttachmentDto
} from './attachments';
import { attachmentAnswer } from './attachmentAnswer';
import { AttachmentRejectedError } from './errors';
import { renderImage } from './imaging';
import { attachmentStore } from './store';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from '../curation/errors';
import { nextStatus } from '../curation/transitions';

/*
 * Files a contributor attaches to the versions of their own submission, while it may still be
 * edited (draft or returned: the same rule as editing its data, `transitions.ts`). A submitted
 * submission is frozen until a curator returns it, and an approved version never changes.
 *
 * Every refusal (who, state, bound, description, file) comes before anything is written. Then
 * files go to the store and the attachment's rows are written (createAttachment), and last the
 * version lists it, in one transaction that checks state and bound again. Should that last
 * check fail (a race with a submit in another tab), the attachment stays unlisted and the
 * cleanup task removes it: the database never names a missing file, and no version lists a
 * file it was refused.
 */

/** The most files one version may carry: enough for a paper's figures, not a dump. */
export const MAX_ATTACHMENTS_PER_VERSION = 12;

/**
 * A refused file, as a domain failure (400 empty, 413 too large, 415 wrong type, 422 unreadable)
 * named by the form field it came from, so that the message is shown beside that field.
 */
export class AttachmentFileError extends DomainError {
	constructor(
		readonly field: 'file' | 'numbers',
		readonly reason: AttachmentRejectedError['code'],
		status: AttachmentRejectedError['status'],
		message: string
	) {
		super(STATUS_CODES[status], message, { fields: { [field]: [message] } });
		this.name = 'AttachmentFileError';
	}
}

const STATUS_CODES: Record<AttachmentRejectedError['status'], ApiErrorCode> = {
	400: 'bad_request',
	413: 'payload_too_large',
	415: 'unsupported_media_type',
	422: 'unprocessable_content'
};

/** The app's store, limits and image workers. */
export function appAttachmentDeps(): AttachmentDeps {
	return {
		store: attachmentStore(),
		limits: { maxBytes: config.ATTACHMENT_MAX_BYTES, maxPixels: config.ATTACHMENT_MAX_PIXELS },
		render: (bytes, photo) => renderImage(bytes, photo)
	};
}

export interface AttachmentTarget {
	submissionId: number;
	versionId: number;
	entryId: number;
	accession: string;
}

/**
 * The version of `user`'s submission that files go to, checked to be editable. `accession`
 * names it; it may be left out when the submission holds one version.
 * @throws {SubmissionNotFoundError} (404) another contributor's submission, or none; an entry
 *   the user may no longer see (a proposed change to an entry since hidden from them).
 * @throws {SubmissionAccessError} (403) a curator acting on someone else's submission (curators
 *   review submissions; they do not edit them).
 * @throws {SubmissionStateError} (409) submitted, decided or withdrawn; an approved version.
 * @throws {SubmissionInvalidError} (400) `entry` missing where several versions are held, or
 *   naming none of them.
 */
export async function editableVersion(
	db: Kysely<Database>,
	user: SessionUser,
	submissionId: number,
	accession: string | null
): Promise<AttachmentTarget> {
	const submission = await db
		.selectFrom('submission')
		.select(['id', 'status', 'submitted_by', 'channel'])
		.where('id', '=', submissionId)
		.executeTakeFirst();
	if (!submission) throw new SubmissionNotFoundError(submissionId);
	if (submission.submitted_by !== user.id) {
		if (!roleAtLeast(user.role, 'curator')) throw new SubmissionNotFoundError(submissionId);
		throw new SubmissionAccessError('only its contributor can attach files to a submission');
	}
	// A CSV batch is reviewed row by row, with no place to show a file beside a row: a file is
	// evidence a curator must see before approving, so batches carry none.
	if (submission.channel === 'csv')
		throw new SubmissionStateError(
			`submission ${submissionId} is a CSV batch, which carries no files; attach evidence to an entry submitted with a form, or propose a change to it once approved`
		);
	nextStatus(submission.status, 'edit', submissionId);
	let query = db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select([
			'entry_version.id',
			'entry_version.status',
			'entry_version.based_on_version',
			'entry.id as entryId',
			'entry.accession'
		])
		.where('entry_version.submission_id', '=', submissionId)
		.orderBy('entry_version.id')
		.limit(2);
	if (accession !== null) query = query.where('entry.accession', '=', accession);
	const versions = await query.execute();
	const version = versions[0];
	if (!version) {
		throw new SubmissionInvalidError({
			entry: [
				accession === null
					? `submission ${submissionId} holds no version`
					: `${accession} is not in submission ${submissionId}`
			]
		});
	}
	if (accession === null && versions.length > 1) {
		throw new SubmissionInvalidError({
			entry: ['this submission holds several entries: name the one the file belongs to']
		});
	}
	if (version.status === 'approved') {
		throw new SubmissionStateError(
			`${version.accession} has been approved in this submission; an approved version's files never change`
		);
	}
	// A proposed change to an entry the contributor may no longer see (moved to another group
	// since) answers as if there were nothing here.
	if (
		version.based_on_version !== null &&
		!(await findVisibleEntry(db, version.accession, viewerOf(user)))
	)
		throw new SubmissionNotFoundError(submissionId);
	return {
		submissionId,
		versionId: version.id,
		entryId: version.entryId,
		accession: version.accession
	};
}

async function countListed(db: Kysely<Database>, versionId: number): Promise<number> {
	const row = await db
		.selectFrom('entry_version_attachment')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('entry_version_id', '=', versionId)
		.executeTakeFirstOrThrow();
	return Number(row.n);
}

async function assertRoom(db: Kysely<Database>, target: AttachmentTarget): Promise<void> {
	if ((await countListed(db, target.versionId)) >= MAX_ATTACHMENTS_PER_VERSION) {
		throw new SubmissionStateError(
			`${target.accession} already carries ${MAX_ATTACHMENTS_PER_VERSION} files, the most one version may have; remove one before attaching another`
		);
	}
}

export interface FileInput {
	fileName: string;
	bytes: Uint8Array;
}

export interface AttachInput {
	/** The accession of the version in the submission; null when it holds one version. */
	accession: string | null;
	meta: AttachmentMeta;
	/** An image, or (with `numbersOnly`) a two-column numbers file plotted without an image. */
	file: FileInput;
	numbers: FileInput | null;
	/** The file is the spectrum's numbers themselves (role 'data'), with no image. */
	numbersOnly: boolean;
}

/**
 * Checks, stores and lists one attachment on a version of `user`'s submission.
 * @throws the errors of `editableVersion`; SubmissionStateError (409) when the version already
 *   carries MAX_ATTACHMENTS_PER_VERSION files; AttachmentFileError (400/413/415/422) for a refused
 *   file, named by its field.
 */
export async function attachToSubmission(
	db: Kysely<Database>,
	deps: AttachmentDeps,
	user: SessionUser,
	submissionId: number,
	input: AttachInput
): Promise<{ target: AttachmentTarget; attachment: AttachmentDto }> {
	const target = await editableVersion(db, user, submissionId, input.accession);
	await assertRoom(db, target);
	const role = input.numbersOnly ? 'data' : 'image';
	if (input.numbersOnly && input.numbers)
		throw new SubmissionInvalidError({
			numbers: ['a numbers-only attachment is one file: send the numbers as `file`']
		});
	let attachment: AttachmentDto;
	try {
		attachment = await createAttachment(db, deps, {
			entryId: target.entryId,
			meta: input.meta,
			fileName: input.file.fileName,
			bytes: input.file.bytes,
			role,
			numbers: input.numbers,
			uploadedBy: user.id
		});
	} catch (e) {
		throw e instanceof AttachmentRejectedError
			? new AttachmentFileError(e.part, e.code, e.status, e.message)
			: e;
	}
	await db.transaction().execute(async (trx) => {
		// Checked again: the submission may have been sent for review meanwhile.
		await editableVersion(trx, user, submissionId, target.accession);
		await assertRoom(trx, target);
		await listOnVersion(trx, target.versionId, [attachment.id]);
		await writeAudit(trx, {
			actorId: user.id,
			action: 'submission.attach',
			entryId: target.entryId,
			submissionId,
			after: { attachmentId: attachment.id, kind: attachment.kind, file: attachment.fileName }
		});
	});
	return { target, attachment };
}

/**
 * Takes an attachment off the version of `user`'s submission that lists it (the file stays for
 * any other version that lists it: an approved base version keeps its own list).
 * @throws the errors of `editableVersion`; SubmissionNotFoundError-like 404 when no version of
 *   the submission lists the attachment.
 */
export async function detachFromSubmission(
	db: Kysely<Database>,
	user: SessionUser,
	submissionId: number,
	attachmentId: number
): Promise<void> {
	await db.transaction().execute(async (trx) => {
		// Checks ownership and state before saying anything about the attachment.
		await editableVersion(trx, user, submissionId, null).catch((e: unknown) => {
			// Several versions: the attachment itself says which.
			if (e instanceof SubmissionInvalidError) return null;
			throw e;
		});
		const listed = await trx
			.selectFrom('entry_version_attachment as l')
			.innerJoin('entry_version as v', 'v.id', 'l.entry_version_id')
			.innerJoin('entry as e', 'e.id', 'v.entry_id')
			.select(['v.id', 'v.status', 'e.id as entryId', 'e.accession'])
			.where('v.submission_id', '=', submissionId)
			.where('l.attachment_id', '=', attachmentId)
			.executeTakeFirst();
		if (!listed) throw new AttachmentNotFoundError(attachmentId, submissionId);
		// The version's own checks (approved, hidden entry), by its accession.
		await editableVersion(trx, user, submissionId, listed.accession);
		await unlistFromVersion(trx, listed.id, attachmentId);
		await writeAudit(trx, {
			actorId: user.id,
			action: 'submission.detach',
			entryId: listed.entryId,
			submissionId,
			before: { attachmentId }
		});
	});
}

/** No such attachment on this submission: 404. */
export class AttachmentNotFoundError extends DomainError {
	constructor(attachmentId: number, submissionId: number) {
		super('not_found', `submission ${submissionId} has no attachment ${attachmentId}`);
		this.name = 'AttachmentNotFoundError';
	}
}

/** A submission's view with each version's attachments, in their order (pages and the API). */
export async function withAttachments(
	db: Kysely<Database>,
	view: SubmissionView,
	base: URL
): Promise<SubmissionWithFiles> {
	const versions = [];
	for (const v of view.versions)
		versions.push({
			...v,
			attachments: (await attachmentsOfVersion(db, v.versionId)).map((a) =>
				attachmentAnswer(a, base)
			)
		});
	return { ...view, versions };
}
