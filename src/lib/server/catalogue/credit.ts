import type { CitedPerson } from '$lib/catalogue/citation';
import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * The people a version's citation names: the contributors of every approved version of the
 * entry up to this one, as authors in the order they first contributed, and the curator who
 * approved it, as editor — each with the name and ORCID iD they had when the version was
 * approved (`user_credit_history`, kept by triggers since migration 0010), so that a citation
 * never changes afterwards. Everything read is frozen: approved versions (their authors,
 * approver and approval time) and the history rows. People without a name are not listed
 * (nothing else of theirs — their e-mail address least of all — is fit to print); a version
 * crediting nobody is cited as by the registry's contributors.
 */

export interface VersionCredit {
	authors: CitedPerson[];
	editors: CitedPerson[];
}

type HistoryRow = {
	user_id: string;
	name: string | null;
	orcid: string | null;
	changed_at: string;
};

/**
 * The name and iD a person had at `at`: the newest history row from before then, or — for a
 * version dated before the account's first row (the demo scenario, imported histories) — the
 * first row there is.
 */
function asOf(rows: HistoryRow[], at: string): CitedPerson | null {
	let chosen = rows[0];
	for (const row of rows) if (row.changed_at < at) chosen = row;
	const name = chosen?.name?.trim();
	return chosen && name ? { name, orcid: chosen.orcid } : null;
}

/** Who the citation of an approved version names (empty lists when nobody is credited). */
export async function versionCredit(
	db: Kysely<Database>,
	entryId: number,
	version: number
): Promise<VersionCredit> {
	const row = await db
		.selectFrom('entry_version')
		.select(['approved_at', 'approved_by'])
		.where('entry_id', '=', entryId)
		.where('version', '=', version)
		.where('status', '=', 'approved')
		.executeTakeFirst();
	if (!row?.approved_at) return { authors: [], editors: [] };
	const contributors = await db
		.selectFrom('entry_version')
		.select((eb) => ['created_by', eb.fn.min('version').as('first')])
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.where('version', '<=', version)
		.where('created_by', 'is not', null)
		.groupBy('created_by')
		.orderBy('first')
		.orderBy('created_by')
		.execute();
	const authorIds = contributors.flatMap((c) => (c.created_by ? [c.created_by] : []));
	const ids = [...new Set([...authorIds, ...(row.approved_by ? [row.approved_by] : [])])];
	if (ids.length === 0) return { authors: [], editors: [] };

	const history = new Map<string, HistoryRow[]>();
	const rows = await db
		.selectFrom('user_credit_history')
		.select(['user_id', 'name', 'orcid', 'changed_at'])
		.where('user_id', 'in', ids)
		.orderBy('changed_at')
		.orderBy('id')
		.execute();
	for (const r of rows) {
		const own = history.get(r.user_id);
		if (own) own.push(r);
		else history.set(r.user_id, [r]);
	}
	const at = row.approved_at;
	const credited = (id: string) => asOf(history.get(id) ?? [], at);
	return {
		authors: authorIds.flatMap((id) => credited(id) ?? []),
		editors: row.approved_by ? [credited(row.approved_by)].flatMap((p) => p ?? []) : []
	};
}
