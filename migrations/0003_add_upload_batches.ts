import type { Kysely } from 'kysely';

/**
 * CSV batches: each version remembers the file row it came from and the warnings found when
 * the file was checked (so a curator's batch view needs no second pass over 100 000 rows), and
 * submissions are found by the hash of their file to warn about uploading it twice.
 */
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema.alterTable('entry_version').addColumn('row_number', 'integer').execute();
	await db.schema.alterTable('entry_version').addColumn('warnings', 'text').execute();
	await db.schema
		.createIndex('submission_by_content')
		.on('submission')
		.column('content_sha256')
		.execute();
	await db.schema
		.createIndex('entry_version_by_submission_row')
		.on('entry_version')
		.columns(['submission_id', 'row_number'])
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropIndex('entry_version_by_submission_row').execute();
	await db.schema.dropIndex('submission_by_content').execute();
	await db.schema.alterTable('entry_version').dropColumn('warnings').execute();
	await db.schema.alterTable('entry_version').dropColumn('row_number').execute();
}
