import { sql, type Kysely } from 'kysely';

/**
 * Attachments as files (issue 15): the evidence behind a value — spectrum images, the spectrum's
 * numbers, structure files — kept content-addressed and tied to entry versions.
 *
 * - `attachment_blob`: one row per stored file (an original, a preview or a thumbnail), keyed by
 *   the SHA-256 of its bytes, which is also its name in the file store; the same content is
 *   stored once however often it is attached.
 * - `attachment`: one attached file as the contributor described it (type, caption, acquisition
 *   conditions, file name) with its original and, for images, its renditions. Never changed
 *   once written, so a version that lists it can never see it change.
 * - `entry_version_attachment`: which attachments a version lists, in order. Approval freezes a
 *   version, so its list is frozen with it; a proposed change starts from its base version's list
 *   (carried forward) and may drop or add items. An attachment listed by no version that can
 *   still be approved is an orphan, removed by the cleanup task.
 *
 * Replaces 0001's `attachment` table, which nothing ever wrote; the migration refuses to run if
 * that table holds a row rather than lose it.
 */
export async function up(db: Kysely<any>): Promise<void> {
	const old = await sql<{ n: number }>`select count(*) as n from attachment`.execute(db);
	if ((old.rows[0]?.n ?? 0) > 0)
		throw new Error('0013: the old attachment table holds rows; move them by hand first');
	await db.schema.dropTable('attachment').execute();

	const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;
	await db.schema
		.createTable('attachment_blob')
		.addColumn('sha256', 'text', (c) => c.primaryKey().check(sql`length(sha256) = 64`))
		.addColumn('media_type', 'text', (c) => c.notNull())
		.addColumn('byte_size', 'integer', (c) => c.notNull().check(sql`byte_size > 0`))
		.addColumn('width', 'integer')
		.addColumn('height', 'integer')
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('attachment')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('kind', 'text', (c) =>
			c
				.notNull()
				.check(
					sql`kind in ('epr_spectrum', 'optical_spectrum', 'mcd_spectrum', 'voltammogram', 'redox_titration', 'mossbauer_spectrum', 'structure', 'other')`
				)
		)
		.addColumn('role', 'text', (c) =>
			c.notNull().check(sql`role in ('image', 'data', 'structure')`)
		)
		.addColumn('caption', 'text', (c) => c.notNull())
		/** JSON of the acquisition conditions (src/lib/schemas/attachment.ts). */
		.addColumn('conditions', 'text', (c) => c.notNull().defaultTo('{}'))
		.addColumn('file_name', 'text', (c) => c.notNull())
		.addColumn('original_sha256', 'text', (c) => c.notNull().references('attachment_blob.sha256'))
		.addColumn('preview_sha256', 'text', (c) => c.references('attachment_blob.sha256'))
		.addColumn('thumb_sha256', 'text', (c) => c.references('attachment_blob.sha256'))
		.addColumn('uploaded_by', 'text', (c) => c.references('User.id').onDelete('set null'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addCheckConstraint(
			'attachment_image_has_renditions',
			sql`(role = 'image') = (preview_sha256 is not null and thumb_sha256 is not null)`
		)
		.execute();
	await db.schema.createIndex('attachment_by_entry').on('attachment').column('entry_id').execute();
	for (const column of ['original_sha256', 'preview_sha256', 'thumb_sha256']) {
		await db.schema
			.createIndex(`attachment_by_${column}`)
			.on('attachment')
			.column(column)
			.execute();
	}

	await db.schema
		.createTable('entry_version_attachment')
		.addColumn('entry_version_id', 'integer', (c) =>
			c.notNull().references('entry_version.id').onDelete('cascade')
		)
		.addColumn('attachment_id', 'integer', (c) => c.notNull().references('attachment.id'))
		.addColumn('position', 'integer', (c) => c.notNull())
		.addPrimaryKeyConstraint('entry_version_attachment_pk', ['entry_version_id', 'attachment_id'])
		.execute();
	await db.schema
		.createIndex('entry_version_attachment_by_attachment')
		.on('entry_version_attachment')
		.column('attachment_id')
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.dropTable('entry_version_attachment').execute();
	await db.schema.dropTable('attachment').execute();
	await db.schema.dropTable('attachment_blob').execute();
	const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;
	await db.schema
		.createTable('attachment')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('entry_version_id', 'integer', (c) => c.references('entry_version.id'))
		.addColumn('kind', 'text', (c) =>
			c
				.notNull()
				.check(
					sql`kind in ('epr_spectrum', 'voltammogram', 'titration_plot', 'optical_spectrum', 'other')`
				)
		)
		.addColumn('caption', 'text', (c) => c.notNull())
		.addColumn('sha256', 'text', (c) => c.notNull())
		.addColumn('media_type', 'text', (c) => c.notNull())
		.addColumn('byte_size', 'integer', (c) => c.notNull())
		.addColumn('width', 'integer', (c) => c.notNull())
		.addColumn('height', 'integer', (c) => c.notNull())
		.addColumn('thumb_sha256', 'text')
		.addColumn('uploaded_by', 'text', (c) => c.references('User.id'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();
}
