import { sql, type Kysely } from 'kysely';

/**
 * The backup log: every backup taken with `npm run db:backup` and every restore done with
 * `npm run db:restore`, so that admins see when the last backup was taken. A restore writes its
 * row into the restored database (which holds the log as it was when that backup was taken).
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('backup_log')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('backup', 'restore')`))
		.addColumn('at', 'text', (c) =>
			c.notNull().defaultTo(sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`)
		)
		// The backup file written, or restored from: an absolute path on the server.
		.addColumn('file', 'text', (c) => c.notNull())
		.addColumn('bytes', 'integer', (c) => c.notNull())
		.addColumn('sha256', 'text', (c) => c.notNull())
		.addColumn('table_count', 'integer', (c) => c.notNull())
		.addColumn('row_count', 'integer', (c) => c.notNull())
		// The newest migration the backup holds.
		.addColumn('last_migration', 'text')
		.addColumn('seconds', 'real', (c) => c.notNull())
		.execute();
	await db.schema
		.createIndex('backup_log_by_time')
		.on('backup_log')
		.columns(['kind', 'at'])
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('backup_log').execute();
}
