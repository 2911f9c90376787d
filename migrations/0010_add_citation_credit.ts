import { sql, type Kysely } from 'kysely';

/**
 * Who a version's citation names, frozen with the version:
 * - `User.orcid`: the ORCID iD a person records on /account (canonical hyphenated form; the
 *   check character is verified by the form, the column checks the shape);
 * - `version_credit`: for each approved version, the people its citation names, copied when the
 *   version is approved — the contributors of every approved version up to it (authors, in the
 *   order they first contributed) and the curator who approved it (editor) — with the name and
 *   ORCID iD they had then. A later change of name or iD never alters an older citation.
 *   Only people with a name are listed; rows are never changed or deleted (triggers).
 *
 * Versions approved before this migration are credited from today's names, by the same rule
 * (`recordVersionCredit` in src/lib/server/catalogue/credit.ts applies it at approval).
 */
export async function up(db: Kysely<any>): Promise<void> {
	await sql`alter table "User" add column "orcid" text check ("orcid" is null or "orcid" glob '[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9X]')`.execute(
		db
	);
	await db.schema
		.createTable('version_credit')
		.addColumn('entry_version_id', 'integer', (c) => c.notNull().references('entry_version.id'))
		.addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('author', 'editor')`))
		.addColumn('position', 'integer', (c) => c.notNull())
		.addColumn('user_id', 'text', (c) => c.references('User.id'))
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('orcid', 'text')
		.addPrimaryKeyConstraint('version_credit_pk', ['entry_version_id', 'role', 'position'])
		.execute();
	await sql`create trigger version_credit_is_immutable
		before update on version_credit
		begin
			select raise(abort, 'the credit of an approved version is immutable');
		end`.execute(db);
	await sql`create trigger version_credit_is_permanent
		before delete on version_credit
		begin
			select raise(abort, 'the credit of an approved version cannot be deleted');
		end`.execute(db);

	await sql`insert into version_credit (entry_version_id, role, position, user_id, name, orcid)
		select v.id, 'author',
			row_number() over (partition by v.id order by c.first_version, c.user_id) - 1,
			c.user_id, trim(u.name), u.orcid
		from entry_version v
		join (
			select entry_id, created_by as user_id, min(version) as first_version
			from entry_version
			where status = 'approved' and created_by is not null
			group by entry_id, created_by
		) c on c.entry_id = v.entry_id and c.first_version <= v.version
		join "User" u on u.id = c.user_id and trim(coalesce(u.name, '')) <> ''
		where v.status = 'approved'`.execute(db);
	await sql`insert into version_credit (entry_version_id, role, position, user_id, name, orcid)
		select v.id, 'editor', 0, v.approved_by, trim(u.name), u.orcid
		from entry_version v
		join "User" u on u.id = v.approved_by and trim(coalesce(u.name, '')) <> ''
		where v.status = 'approved'`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('version_credit').execute();
	await db.schema.alterTable('User').dropColumn('orcid').execute();
}
