import { sql, type Kysely } from 'kysely';

/**
 * What the curation workflow needs beyond the first schema: the visibility a version asks for
 * (applied to its entry on approval), curators' choice of notices, and the queue of notices
 * waiting for a daily digest.
 */
export async function up(db: Kysely<any>): Promise<void> {
	const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;

	// Null in all three means "leave the entry's visibility as it is".
	await db.schema
		.alterTable('entry_version')
		.addColumn('visibility', 'text', (c) =>
			c.check(sql`visibility is null or visibility in ('public', 'group', 'embargoed')`)
		)
		.execute();
	await db.schema
		.alterTable('entry_version')
		.addColumn('group_id', 'integer', (c) => c.references('research_group.id'))
		.execute();
	await db.schema.alterTable('entry_version').addColumn('embargo_until', 'text').execute();

	await db.schema
		.alterTable('User')
		.addColumn('curationNotices', 'text', (c) =>
			c
				.notNull()
				.defaultTo('immediate')
				.check(sql`"curationNotices" in ('immediate', 'daily', 'off')`)
		)
		.execute();
	await db.schema.alterTable('User').addColumn('lastDigestAt', 'text').execute();

	await db.schema
		.createTable('curation_notice')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('submission_id', 'integer', (c) =>
			c.notNull().references('submission.id').onDelete('cascade')
		)
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('sent_at', 'text')
		.execute();
	await db.schema
		.createIndex('curation_notice_unsent')
		.on('curation_notice')
		.columns(['user_id', 'sent_at'])
		.execute();

	await db.schema
		.createIndex('submission_by_status')
		.on('submission')
		.columns(['status', 'submitted_at'])
		.execute();
	await db.schema.createIndex('audit_log_by_time').on('audit_log').column('at').execute();
}

// SQLite cannot drop a column that carries a CHECK or a foreign key, so this step has no way back.
export async function down(): Promise<void> {
	throw new Error('0002 adds checked columns SQLite cannot drop; restore from a backup instead.');
}
