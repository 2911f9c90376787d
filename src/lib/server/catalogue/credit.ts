import { sql, type Kysely } from 'kysely';
import type { Database } from '../db/schema';

/*
 * The people a version's citation names (table `version_credit`, migration 0010): the
 * contributors of every approved version of the entry up to this one, as authors in the order
 * they first contributed, and the curator who approved it, as editor. Copied when the version is
 * approved, with the name and ORCID iD each person had then, so that a citation never changes
 * afterwards. People without a name are not listed (nothing else of theirs — their e-mail
 * address least of all — is fit to print); a version crediting nobody is cited as by the
 * registry's contributors. Migration 0010 applied the same rule to versions approved before it.
 */

/** One person named in a citation. */
export interface CreditedPerson {
	name: string;
	orcid: string | null;
}

export interface VersionCredit {
	authors: CreditedPerson[];
	editors: CreditedPerson[];
}

/**
 * Records the credit of a version just approved (numbered, status approved), in the approving
 * transaction.
 */
export async function recordVersionCredit(trx: Kysely<Database>, versionId: number): Promise<void> {
	await sql`insert into version_credit (entry_version_id, role, position, user_id, name, orcid)
		select v.id, 'author',
			row_number() over (order by c.first_version, c.user_id) - 1,
			c.user_id, trim(u.name), u.orcid
		from entry_version v
		join (
			select entry_id, created_by as user_id, min(version) as first_version
			from entry_version
			where status = 'approved' and created_by is not null
			group by entry_id, created_by
		) c on c.entry_id = v.entry_id and c.first_version <= v.version
		join "User" u on u.id = c.user_id and trim(coalesce(u.name, '')) <> ''
		where v.id = ${versionId} and v.status = 'approved'`.execute(trx);
	await sql`insert into version_credit (entry_version_id, role, position, user_id, name, orcid)
		select v.id, 'editor', 0, v.approved_by, trim(u.name), u.orcid
		from entry_version v
		join "User" u on u.id = v.approved_by and trim(coalesce(u.name, '')) <> ''
		where v.id = ${versionId} and v.status = 'approved'`.execute(trx);
}

/** Who the citation of an approved version names (empty lists when nobody is credited). */
export async function versionCredit(
	db: Kysely<Database>,
	entryId: number,
	version: number
): Promise<VersionCredit> {
	const rows = await db
		.selectFrom('version_credit')
		.innerJoin('entry_version', 'entry_version.id', 'version_credit.entry_version_id')
		.select(['version_credit.role', 'version_credit.name', 'version_credit.orcid'])
		.where('entry_version.entry_id', '=', entryId)
		.where('entry_version.version', '=', version)
		.where('entry_version.status', '=', 'approved')
		.orderBy('version_credit.role')
		.orderBy('version_credit.position')
		.execute();
	const person = (r: (typeof rows)[number]): CreditedPerson => ({ name: r.name, orcid: r.orcid });
	return {
		authors: rows.filter((r) => r.role === 'author').map(person),
		editors: rows.filter((r) => r.role === 'editor').map(person)
	};
}
