import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import type { SessionUser } from '../auth/roles';
import { config } from '../config';
import { createAttachment, listOnVersion } from '../attachments/attachments';
import { attachmentStore } from '../attachments/store';
import type { BlobStore } from '../attachments/storage';

/*
 * An uploaded structure file is kept as an attachment of kind and role 'structure' in the
 * attachment store (content-addressed: the same file twice is stored once).
 *
 * - Read step: the file becomes an unlisted attachment of the protein. Unlisted, only its
 *   uploader may fetch it (/files/{id}/original), and the orphan cleanup removes it after its
 *   grace period if the flow is abandoned.
 * - Plan and submit steps find the file again by that attachment's id, and only when it is the
 *   signed-in contributor's own unlisted structure file of this protein: a client can never name
 *   another person's file (the answer is the same as for a missing one).
 * - Submit: every distance entry of the batch gets its own attachment row naming the same stored
 *   file (an attachment belongs to one entry), listed on the distance's proposed version, so each
 *   distance's evidence is the downloadable file; approval freezes that list with the version.
 */

export interface StructureFileRef {
	attachmentId: number;
	sha256: string;
	fileName: string;
}

const store = (): BlobStore => attachmentStore();

/** The caption of the file as a distance's evidence. */
export const distanceCaption = (structureId: string) =>
	`Structure ${structureId} as uploaded, in which this distance was measured`;

/**
 * Stores the bytes (already read through by readStructureFile) as an unlisted attachment of the
 * entry (the protein, in the structure flow).
 */
export async function keepStructureFile(
	db: Kysely<Database>,
	input: {
		entryId: number;
		bytes: Uint8Array;
		fileName: string;
		uploadedBy: string;
		caption?: string;
	},
	blobs: BlobStore = store()
): Promise<StructureFileRef> {
	const a = await createAttachment(
		db,
		{
			store: blobs,
			limits: { maxBytes: config.STRUCTURE_MAX_BYTES, maxPixels: config.ATTACHMENT_MAX_PIXELS },
			render: () => Promise.reject(new Error('a structure file is never rendered'))
		},
		{
			entryId: input.entryId,
			role: 'structure',
			meta: {
				kind: 'structure',
				caption: input.caption ?? 'Structure file the distances were measured in'
			},
			fileName: input.fileName,
			bytes: input.bytes,
			uploadedBy: input.uploadedBy
		}
	);
	return { attachmentId: a.id, sha256: a.sha256, fileName: a.fileName };
}

/**
 * The structure file behind an attachment id posted by the form: only the user's own, unlisted
 * structure attachment of this protein. Null for anything else, whatever the reason.
 */
export async function ownStructureFile(
	db: Kysely<Database>,
	attachmentId: number,
	user: Pick<SessionUser, 'id'>,
	proteinEntryId: number
): Promise<StructureFileRef | null> {
	const row = await db
		.selectFrom('attachment as a')
		.select(['a.id', 'a.original_sha256', 'a.file_name'])
		.where('a.id', '=', attachmentId)
		.where('a.role', '=', 'structure')
		.where('a.uploaded_by', '=', user.id)
		.where('a.entry_id', '=', proteinEntryId)
		.where(({ not, exists, selectFrom }) =>
			not(
				exists(
					selectFrom('entry_version_attachment as l')
						.select('l.attachment_id')
						.whereRef('l.attachment_id', '=', 'a.id')
				)
			)
		)
		.executeTakeFirst();
	return row
		? { attachmentId: row.id, sha256: row.original_sha256, fileName: row.file_name }
		: null;
}

/** The stored bytes of a structure file, or null when the store no longer has them. */
export function structureBytes(
	file: StructureFileRef,
	blobs: BlobStore = store()
): Promise<Uint8Array | null> {
	return blobs.get(file.sha256);
}

/**
 * Lists the structure file on every proposed version of a submission (the distances it
 * created), one attachment row per distance entry, all naming the same stored file. Runs in the
 * submitting transaction: the batch and its evidence are written together or not at all.
 */
export async function listOnSubmission(
	trx: Kysely<Database>,
	from: StructureFileRef,
	submissionId: number,
	structureId: string
): Promise<number> {
	const source = await trx
		.selectFrom('attachment')
		.select(['kind', 'role', 'conditions', 'file_name', 'original_sha256', 'uploaded_by'])
		.where('id', '=', from.attachmentId)
		.executeTakeFirstOrThrow();
	const versions = await trx
		.selectFrom('entry_version')
		.select(['id', 'entry_id'])
		.where('submission_id', '=', submissionId)
		.orderBy('id')
		.execute();
	for (const v of versions) {
		const { id } = await trx
			.insertInto('attachment')
			.values({
				...source,
				caption: distanceCaption(structureId),
				entry_id: v.entry_id
			})
			.returning('id')
			.executeTakeFirstOrThrow();
		await listOnVersion(trx, v.id, [id]);
	}
	return versions.length;
}
