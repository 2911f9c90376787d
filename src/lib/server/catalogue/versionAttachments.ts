import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * The one piece of the attachment lists that curation needs when it creates a proposed change.
 * It lives here, below both, because the attachments folder sits above curation (it reaches
 * the calculation workers, which reach the kinds and uploads, which reach curation):
 * DEVELOPERS.md, "Import layers". attachments/attachments.ts re-exports it.
 */

/** A proposed change starts with its base version's list (call when the change is created). */
export async function carryForward(
	db: Kysely<Database>,
	fromVersionId: number,
	toVersionId: number
): Promise<void> {
	const rows = await db
		.selectFrom('entry_version_attachment')
		.select(['attachment_id', 'position'])
		.where('entry_version_id', '=', fromVersionId)
		.execute();
	if (rows.length === 0) return;
	await db
		.insertInto('entry_version_attachment')
		.values(rows.map((r) => ({ ...r, entry_version_id: toVersionId })))
		.onConflict((oc) => oc.columns(['entry_version_id', 'attachment_id']).doNothing())
		.execute();
}
