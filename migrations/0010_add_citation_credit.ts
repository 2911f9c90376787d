import { sql, type Kysely } from 'kysely';

/**
 * What citations name people with, kept so that a version's citation never changes:
 * - `User.orcid`: the ORCID iD a person records on /account (canonical hyphenated form; the
 *   form checks the check character, the column the shape);
 * - `user_credit_history`: every name and iD a person has had, and from when. Triggers on `User`
 *   add a row whenever an account is created or its name or iD changes, whoever changes it
 *   (the account page, an admin, sign-up, Auth.js); rows are never changed or deleted. A
 *   version's citation names its contributors and approving curator as they were when it was
 *   approved (src/lib/server/catalogue/credit.ts), so the approval itself writes nothing more.
 *
 * Accounts that exist already get one row dated 1970-01-01: their name as it is now stands for
 * every version approved before this migration.
 */
export async function up(db: Kysely<any>): Promise<void> {
	await sql`alter table "User" add column "orcid" text check ("orcid" is null or "orcid" glob '[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9]-[0-9][0-9][0-9][0-9X]')`.execute(
		db
	);
	await db.schema
		.createTable('user_credit_history')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		// No foreign key: the history outlives anything that happens to the account.
		.addColumn('user_id', 'text', (c) => c.notNull())
		.addColumn('name', 'text')
		.addColumn('orcid', 'text')
		.addColumn('changed_at', 'text', (c) => c.notNull())
		.execute();
	await db.schema
		.createIndex('user_credit_history_by_user')
		.on('user_credit_history')
		.columns(['user_id', 'changed_at'])
		.execute();
	// The same ISO 8601 form as approved_at (JavaScript's toISOString), so that they compare.
	const now = sql`strftime('%Y-%m-%dT%H:%M:%fZ', 'now')`;
	await sql`create trigger user_credit_on_insert after insert on "User"
		begin
			insert into user_credit_history (user_id, name, orcid, changed_at)
			values (new.id, new.name, new.orcid, ${now});
		end`.execute(db);
	await sql`create trigger user_credit_on_update after update of name, orcid on "User"
		when old.name is not new.name or old.orcid is not new.orcid
		begin
			insert into user_credit_history (user_id, name, orcid, changed_at)
			values (new.id, new.name, new.orcid, ${now});
		end`.execute(db);
	await sql`create trigger user_credit_history_is_immutable
		before update on user_credit_history
		begin
			select raise(abort, 'the credit history is immutable');
		end`.execute(db);
	await sql`create trigger user_credit_history_is_permanent
		before delete on user_credit_history
		begin
			select raise(abort, 'the credit history cannot be deleted');
		end`.execute(db);
	await sql`insert into user_credit_history (user_id, name, orcid, changed_at)
		select id, name, orcid, '1970-01-01T00:00:00.000Z' from "User"`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
	for (const trigger of ['user_credit_on_insert', 'user_credit_on_update'])
		await sql`drop trigger if exists ${sql.ref(trigger)}`.execute(db);
	await db.schema.dropTable('user_credit_history').execute();
	await db.schema.alterTable('User').dropColumn('orcid').execute();
}
