import type { Kysely } from 'kysely';
import { entryFormValues } from '$lib/catalogue/entryForm';
import type { EntryKind } from '$lib/kinds';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import type { Database } from '../db/schema';
import { getEntryView } from '../catalogue/entryView';

/* What the entry forms need besides the fields: the groups one may share with, and prefills. */

export async function groupsForSharing(db: Kysely<Database>, user: SessionUser) {
	let q = db.selectFrom('research_group').select(['id', 'name']).orderBy('name');
	// Curators may place an entry in any group; others only in their own.
	if (!roleAtLeast(user.role, 'curator')) {
		if (user.groupIds.length === 0) return [];
		q = q.where('id', 'in', user.groupIds);
	}
	return q.execute();
}

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '');

/** Form values of the latest approved version of an entry the user may see, for proposing a change. */
export async function valuesForEditing(
	db: Kysely<Database>,
	user: SessionUser,
	kind: EntryKind,
	accession: string
): Promise<Record<string, string> | null> {
	const view = await getEntryView(db, accession, undefined, { groupIds: user.groupIds }).catch(
		() => null
	);
	if (!view || view.kind !== kind) return null;
	const entry = await db
		.selectFrom('entry')
		.select(['group_id', 'embargo_until'])
		.where('accession', '=', accession)
		.executeTakeFirstOrThrow();
	return {
		...entryFormValues(kind, view.data),
		visibility: view.live.visibility,
		groupId: entry.group_id === null ? '' : String(entry.group_id),
		embargoUntil: day(entry.embargo_until)
	};
}

/** Form values of a version held by a submission. */
export function valuesOfVersion(
	kind: EntryKind,
	data: Record<string, unknown>,
	visibility: { visibility: string; groupId: number | null; embargoUntil: string | null } | null,
	changeNote: string | null
): Record<string, string> {
	return {
		...entryFormValues(kind, data),
		visibility: visibility?.visibility ?? 'public',
		groupId: visibility?.groupId ? String(visibility.groupId) : '',
		embargoUntil: day(visibility?.embargoUntil ?? null),
		changeNote: changeNote ?? ''
	};
}
