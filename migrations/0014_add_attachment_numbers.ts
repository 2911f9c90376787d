import type { Kysely } from 'kysely';

/**
 * An image attachment may carry the spectrum's numbers beside it (issue 15): the two-column
 * text file the figure was drawn from, stored content-addressed like every other file. An
 * attachment of role 'data' is its numbers alone (its original); one of role 'image' names its
 * companion here, or nothing. The row still never changes once written.
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.alterTable('attachment')
		.addColumn('data_sha256', 'text', (c) => c.references('attachment_blob.sha256'))
		.execute();
	await db.schema.alterTable('attachment').addColumn('data_file_name', 'text').execute();
	await db.schema
		.createIndex('attachment_by_data_sha256')
		.on('attachment')
		.column('data_sha256')
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropIndex('attachment_by_data_sha256').execute();
	await db.schema.alterTable('attachment').dropColumn('data_file_name').execute();
	await db.schema.alterTable('attachment').dropColumn('data_sha256').execute();
}
