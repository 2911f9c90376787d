import { sql, type Kysely } from 'kysely';

/**
 * Requests for contributor access (a reader asks from the 403 page; admins see them on
 * /admin/users): at most one open request per user, enforced by a partial unique index. Also
 * gives every audit record's time one written form (`YYYY-MM-DDTHH:MM:SS.sssZ`): records written
 * with a time of their own (approvals at a stated instant) could carry another precision, and
 * "…:00Z" sorts after "…:00.500Z" as text. The log is read newest first by (at, id).
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('access_request')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('contributor')`))
		.addColumn('message', 'text')
		.addColumn('status', 'text', (c) =>
			c
				.notNull()
				.defaultTo('open')
				.check(sql`status in ('open', 'granted', 'dismissed')`)
		)
		.addColumn('created_at', 'text', (c) =>
			c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`)
		)
		.addColumn('closed_at', 'text')
		.addColumn('closed_by', 'text', (c) => c.references('User.id').onDelete('set null'))
		.execute();
	await sql`create unique index access_request_one_open on access_request (user_id) where status = 'open'`.execute(
		db
	);
	await db.schema
		.createIndex('access_request_by_user')
		.on('access_request')
		.columns(['user_id', 'created_at'])
		.execute();

	await sql`update audit_log set at = strftime('%Y-%m-%dT%H:%M:%fZ', at)
		where strftime('%Y-%m-%dT%H:%M:%fZ', at) is not null
		and at != strftime('%Y-%m-%dT%H:%M:%fZ', at)`.execute(db);
	await db.schema.dropIndex('audit_log_by_time').execute();
	await db.schema.createIndex('audit_log_by_time').on('audit_log').columns(['at', 'id']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropIndex('audit_log_by_time').execute();
	await db.schema.createIndex('audit_log_by_time').on('audit_log').column('at').execute();
	await db.schema.dropTable('access_request').execute();
}
