import { sql, type Expression, type ExpressionBuilder, type SqlBool } from 'kysely';
import type { Database } from '../db/schema';

/** Who is reading: the groups whose group-only and embargoed entries they may see. Null = signed out. */
export interface Viewer {
	groupIds: readonly number[];
}

/** Visibility columns of an entry row. */
export interface EntryVisibility {
	visibility: string;
	embargo_until: string | null;
	group_id: number | null;
}

/** The start of time for "public since": rows public from creation carry this. */
export const ALWAYS_PUBLIC = '1970-01-01T00:00:00.000Z';

/**
 * The one rule for whether an entry may be shown: it is public; or embargoed and its date has
 * passed; or the viewer belongs to its group (members see their group's group-only and
 * embargoed entries). Every read path (pages, search, API, export, citations) applies it, in
 * SQL through `entryIsVisible`/`potentialIsVisible` or in memory through `entryRowIsVisible`/
 * `potentialRowVisibility`.
 */
export function entryRowIsVisible(
	entry: EntryVisibility,
	viewer: Viewer | null,
	now: Date = new Date()
): boolean {
	if (entry.visibility === 'public') return true;
	if (entry.group_id !== null && (viewer?.groupIds ?? []).includes(entry.group_id)) return true;
	return (
		entry.visibility === 'embargoed' &&
		entry.embargo_until !== null &&
		entry.embargo_until <= now.toISOString()
	);
}

export function entryIsVisible<DB extends Database, TB extends keyof DB & string>(
	eb: ExpressionBuilder<DB, TB>,
	entryAlias: string,
	viewer: Viewer | null
): Expression<SqlBool> {
	const col = (name: string) => sql.ref(`${entryAlias}.${name}`);
	const groups = viewer?.groupIds ?? [];
	return eb.or([
		eb(col('visibility'), '=', 'public'),
		eb.and([
			eb(col('visibility'), '=', 'embargoed'),
			eb(col('embargo_until'), '<=', new Date().toISOString())
		]),
		...(groups.length > 0 ? [eb(col('group_id'), 'in', [...groups])] : [])
	]);
}

/**
 * When a row that depends on several entries (a potential on its centre and protein) becomes
 * visible to everyone: never (null) while any is group-only, else the latest embargo date.
 */
export function publicFrom(entries: readonly EntryVisibility[]): string | null {
	let from = ALWAYS_PUBLIC;
	for (const e of entries) {
		if (e.visibility === 'group') return null;
		if (e.visibility === 'embargoed') {
			if (e.embargo_until === null) return null;
			if (e.embargo_until > from) from = e.embargo_until;
		}
	}
	return from;
}

/**
 * The group whose members may see a row that depends on several entries (a potential, its
 * centre and its protein) before its `public_from`: the one group every entry still hidden
 * from outsiders carries, else none. The row is visible only when all its entries are, and the
 * read model keeps a single group per row, so this is conservative:
 * - public entries are ignored, whatever `group_id` they carry (they hide nothing), and so are
 *   embargoed entries whose date has passed at `now` (time only moves forward, and a changed
 *   embargo refreshes the row through `setEntryVisibility`);
 * - when the hidden entries carry different groups (a group-1 potential on a group-2 protein),
 *   or one of them carries none (an embargo with no group), no group sees the row early:
 *   members of both groups wait for `public_from` like everyone else (forever while an entry
 *   is group-only). Safe, never wider than the rule; a reader who could see every entry may
 *   still see each of them on its own page.
 */
export function earlyGroup(
	entries: readonly EntryVisibility[],
	now: Date = new Date()
): number | null {
	const nowIso = now.toISOString();
	let group: number | null = null;
	for (const e of entries) {
		if (e.visibility === 'public') continue;
		if (e.visibility === 'embargoed' && e.embargo_until !== null && e.embargo_until <= nowIso)
			continue;
		if (e.group_id === null) return null;
		if (group !== null && group !== e.group_id) return null;
		group = e.group_id;
	}
	return group;
}

/** Visibility of rows of the denormalised potential read model (see migration 0001). */
export function potentialIsVisible<DB extends Database, TB extends keyof DB & string>(
	eb: ExpressionBuilder<DB, TB>,
	alias: string,
	viewer: Viewer | null
): Expression<SqlBool> {
	const groups = viewer?.groupIds ?? [];
	return eb.or([
		eb(sql.ref(`${alias}.public_from`), '<=', new Date().toISOString()),
		...(groups.length > 0 ? [eb(sql.ref(`${alias}.group_id`), 'in', [...groups])] : [])
	]);
}

/**
 * The same rule as `potentialIsVisible`, in memory, for the search index's columns
 * (search/potentialIndex.ts): a row is visible once its `public_from` has passed, or to members
 * of its group. `publicFromMs` is `public_from` as epoch milliseconds (+Infinity when the row has
 * none: it waits on a group-only entry); stored dates are ISO 8601 in UTC, so comparing
 * milliseconds orders them as SQL compares the strings. The property test in
 * tests/integration/potentialIndex.test.ts holds the two rules together.
 */
export function potentialRowVisibility(
	viewer: Viewer | null,
	now: Date = new Date()
): (publicFromMs: number, groupId: number | null) => boolean {
	const nowMs = now.getTime();
	const groups = new Set(viewer?.groupIds ?? []);
	return (publicFromMs, groupId) =>
		publicFromMs <= nowMs || (groupId !== null && groups.has(groupId));
}

/** The viewer a signed-in user reads as: their groups, whatever their role. */
export function viewerOf(user: { groupIds: readonly number[] }): Viewer {
	return { groupIds: user.groupIds };
}
