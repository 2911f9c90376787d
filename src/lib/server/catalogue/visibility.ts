import { sql, type ExpressionBuilder, type Expression, type SqlBool } from 'kysely';
import type { Database } from '../db/schema';

/** Who is reading: the groups whose group-only entries they may see. Null = signed out. */
export interface Viewer {
	groupIds: readonly number[];
}

/**
 * The one rule for whether an entry may be shown: public; embargoed and past its date; or
 * group-only and the viewer is in its group. Every read path (pages, search, API, export,
 * citations) filters through this.
 */
export function entryIsVisible<DB extends Database, TB extends keyof DB & string>(
	eb: ExpressionBuilder<DB, TB>,
	entryAlias: string,
	viewer: Viewer | null
): Expression<SqlBool> {
	const col = (name: string) => sql.ref(`${entryAlias}.${name}`);
	const nowIso = new Date().toISOString();
	const groups = viewer?.groupIds ?? [];
	return eb.or([
		eb(col('visibility'), '=', 'public'),
		eb.and([eb(col('visibility'), '=', 'embargoed'), eb(col('embargo_until'), '<=', nowIso)]),
		...(groups.length > 0
			? [eb.and([eb(col('visibility'), '=', 'group'), eb(col('group_id'), 'in', [...groups])])]
			: [])
	]);
}

/** The same rule for one entry row already in memory. */
export function entryRowIsVisible(
	entry: { visibility: string; embargo_until: string | null; group_id: number | null },
	viewer: Viewer | null,
	now: Date = new Date()
): boolean {
	if (entry.visibility === 'public') return true;
	if (entry.visibility === 'embargoed') {
		return entry.embargo_until !== null && entry.embargo_until <= now.toISOString();
	}
	return entry.group_id !== null && (viewer?.groupIds ?? []).includes(entry.group_id);
}
