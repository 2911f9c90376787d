import type { Kysely } from 'kysely';
import { ATTACHMENT_KIND_LABELS } from '$lib/schemas/attachment';
import { attachmentsOfVersion } from '$lib/server/attachments/attachments';
import { showAttachment, type ShownAttachment } from '$lib/server/attachments/shownAttachments';
import type { BlobStore } from '$lib/server/attachments/storage';
import type { Database } from '$lib/server/db/schema';

/*
 * The attachments of each version under review, beside its values; for a proposed change, which
 * were carried forward from the version it is based on, which were added, and which it drops
 * (compared by attachment id: an attachment row never changes, so the same id is the same file
 * with the same caption and conditions).
 */

export interface ReviewAttachments {
	shown: ShownAttachment[];
	/** By attachment id; null for a new entry (nothing to compare with). */
	changes: Record<number, 'carried' | 'added'> | null;
	/** The base version's attachments this change no longer lists. */
	dropped: { id: number; kindLabel: string; caption: string; fileName: string }[];
	/** The base version's number, for the words. */
	basedOn: number | null;
}

export async function reviewAttachments(
	db: Kysely<Database>,
	store: BlobStore,
	versionIds: readonly number[]
): Promise<Record<number, ReviewAttachments>> {
	const out: Record<number, ReviewAttachments> = {};
	for (const versionId of versionIds) {
		const version = await db
			.selectFrom('entry_version')
			.select(['entry_id', 'based_on_version'])
			.where('id', '=', versionId)
			.executeTakeFirstOrThrow();
		const listed = await attachmentsOfVersion(db, versionId);
		const base =
			version.based_on_version === null
				? null
				: await db
						.selectFrom('entry_version')
						.select('id')
						.where('entry_id', '=', version.entry_id)
						.where('version', '=', version.based_on_version)
						.where('status', '=', 'approved')
						.executeTakeFirst();
		const baseList = base ? await attachmentsOfVersion(db, base.id) : [];
		if (listed.length === 0 && baseList.length === 0) continue;
		const baseIds = new Set(baseList.map((a) => a.id));
		const listedIds = new Set(listed.map((a) => a.id));
		const shown = await Promise.all(listed.map((a) => showAttachment(store, a)));
		out[versionId] = {
			shown,
			changes: base
				? Object.fromEntries(listed.map((a) => [a.id, baseIds.has(a.id) ? 'carried' : 'added']))
				: null,
			dropped: baseList
				.filter((a) => !listedIds.has(a.id))
				.map((a) => ({
					id: a.id,
					kindLabel: ATTACHMENT_KIND_LABELS[a.kind],
					caption: a.caption,
					fileName: a.fileName
				})),
			basedOn: base ? version.based_on_version : null
		};
	}
	return out;
}
