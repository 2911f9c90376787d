import type { Kysely } from 'kysely';
import type { EntryKind } from '$lib/kinds';
import type { Database } from '../db/schema';
import { serverKind } from '../kinds';
import { entryRowIsVisible, type Viewer } from './visibility';

/*
 * Finding an entry by an accession a client sent. Every path that takes an accession from a
 * client (permalinks, the entries API, proposed changes, references in forms, API bodies and CSV
 * rows) asks here, and gets the same answer — nothing — for an entry that does not exist, that
 * the reader may not see (itself or an entry it depends on), or that has no approved version
 * yet. A caller that reports the failure must report all three alike, so that neither existence
 * nor kind of a hidden or pending entry can be learnt from a message.
 */

/**
 * Every entry an entry of this kind depends on, however far (a potential: its centre and that
 * centre's protein): seeing it requires seeing them.
 */
async function dependencies(
	db: Kysely<Database>,
	entryId: number,
	kind: EntryKind
): Promise<number[]> {
	const found: number[] = [];
	let frontier = await serverKind(kind).dependsOn(db, entryId);
	// Kinds depend on kinds nearer the protein, so this ends within a few steps.
	while (frontier.length > 0) {
		const next = [];
		for (const dependency of frontier) {
			if (found.includes(dependency.id)) continue;
			found.push(dependency.id);
			next.push(...(await serverKind(dependency.kind).dependsOn(db, dependency.id)));
		}
		frontier = next;
	}
	return found;
}

/** Whether the entry's approved read-model row exists (it does once a version is approved). */
async function hasApprovedVersion(db: Kysely<Database>, entryId: number): Promise<boolean> {
	const row = await db
		.selectFrom('entry_version')
		.select('id')
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.limit(1)
		.executeTakeFirst();
	return row !== undefined;
}

/**
 * The entry row behind `accession` when it has an approved version and `viewer` may see it and
 * everything it depends on; otherwise null, whatever the reason.
 */
export async function findVisibleEntry(
	db: Kysely<Database>,
	accession: string,
	viewer: Viewer | null
) {
	const entry = await db
		.selectFrom('entry')
		.selectAll()
		.where('accession', '=', accession)
		.executeTakeFirst();
	if (!entry || !entryRowIsVisible(entry, viewer)) return null;
	if (!(await hasApprovedVersion(db, entry.id))) return null;
	const needed = await dependencies(db, entry.id, entry.kind);
	if (needed.length > 0) {
		const rows = await db
			.selectFrom('entry')
			.select(['visibility', 'embargo_until', 'group_id'])
			.where('id', 'in', needed)
			.execute();
		if (!rows.every((r) => entryRowIsVisible(r, viewer))) return null;
	}
	return entry;
}

/** The one message for an accession that cannot be used, whatever the reason. */
export function notVisibleMessage(accession: string, kind?: EntryKind): string {
	const what = kind ? `${kind.replace('_', ' ')} ` : 'entry ';
	return `no ${what}${accession} in the registry (or not visible to you)`;
}
