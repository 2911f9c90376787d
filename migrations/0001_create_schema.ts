import { sql, type Kysely } from 'kysely';

// The whole map of the registry in one first migration. Frozen once landed: later changes get
// their own numbered file. Never import application code here (the migration must mean the same
// thing forever, whatever the app becomes).

const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;
const randomId = sql`(lower(hex(randomblob(16))))`;

export async function up(db: Kysely<any>): Promise<void> {
	// --- Accounts: Auth.js's adapter dictates these four table and column names. ---
	await db.schema
		.createTable('User')
		.addColumn('id', 'text', (c) => c.primaryKey().defaultTo(randomId))
		.addColumn('name', 'text')
		.addColumn('email', 'text', (c) => c.unique())
		.addColumn('emailVerified', 'text')
		.addColumn('image', 'text')
		.addColumn('role', 'text', (c) =>
			c
				.notNull()
				.defaultTo('reader')
				.check(sql`role in ('reader', 'contributor', 'curator', 'admin')`)
		)
		.addColumn('passwordHash', 'text')
		.addColumn('createdAt', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('disabledAt', 'text')
		.execute();

	await db.schema
		.createTable('Account')
		.addColumn('id', 'text', (c) => c.primaryKey().defaultTo(randomId))
		.addColumn('userId', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('type', 'text', (c) => c.notNull())
		.addColumn('provider', 'text', (c) => c.notNull())
		.addColumn('providerAccountId', 'text', (c) => c.notNull())
		.addColumn('refresh_token', 'text')
		.addColumn('access_token', 'text')
		.addColumn('expires_at', 'integer')
		.addColumn('token_type', 'text')
		.addColumn('scope', 'text')
		.addColumn('id_token', 'text')
		.addColumn('session_state', 'text')
		.addUniqueConstraint('Account_provider_unique', ['provider', 'providerAccountId'])
		.execute();

	await db.schema
		.createTable('Session')
		.addColumn('id', 'text', (c) => c.primaryKey().defaultTo(randomId))
		.addColumn('userId', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('sessionToken', 'text', (c) => c.notNull().unique())
		.addColumn('expires', 'text', (c) => c.notNull())
		.execute();

	await db.schema
		.createTable('VerificationToken')
		.addColumn('identifier', 'text', (c) => c.notNull())
		.addColumn('token', 'text', (c) => c.notNull().unique())
		.addColumn('expires', 'text', (c) => c.notNull())
		.addPrimaryKeyConstraint('VerificationToken_pk', ['identifier', 'token'])
		.execute();

	// --- Groups (a lab or a consortium) ---
	await db.schema
		.createTable('research_group')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('slug', 'text', (c) => c.notNull().unique())
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('group_member')
		.addColumn('group_id', 'integer', (c) =>
			c.notNull().references('research_group.id').onDelete('cascade')
		)
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('is_manager', 'integer', (c) => c.notNull().defaultTo(0))
		.addColumn('joined_at', 'text', (c) => c.notNull().defaultTo(now))
		.addPrimaryKeyConstraint('group_member_pk', ['group_id', 'user_id'])
		.execute();

	// --- Entries and their immutable versions ---
	await db.schema
		.createTable('entry')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('accession', 'text', (c) => c.notNull().unique())
		.addColumn('kind', 'text', (c) =>
			c
				.notNull()
				.check(sql`kind in ('protein', 'centre', 'potential', 'spin_record', 'distance', 'source')`)
		)
		.addColumn('visibility', 'text', (c) =>
			c
				.notNull()
				.defaultTo('public')
				.check(sql`visibility in ('public', 'group', 'embargoed')`)
		)
		.addColumn('group_id', 'integer', (c) => c.references('research_group.id'))
		.addColumn('embargo_until', 'text')
		.addColumn('is_demo', 'integer', (c) => c.notNull().defaultTo(0))
		.addColumn('created_by', 'text', (c) => c.references('User.id'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('merged_into_entry_id', 'integer', (c) => c.references('entry.id'))
		.execute();

	await db.schema
		.createTable('submission')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('channel', 'text', (c) => c.notNull().check(sql`channel in ('form', 'csv', 'seed')`))
		.addColumn('status', 'text', (c) =>
			c
				.notNull()
				.defaultTo('draft')
				.check(
					sql`status in ('draft', 'submitted', 'returned', 'approved', 'partially_approved', 'rejected', 'withdrawn')`
				)
		)
		.addColumn('title', 'text', (c) => c.notNull())
		.addColumn('submitted_by', 'text', (c) => c.references('User.id'))
		.addColumn('content_sha256', 'text')
		.addColumn('row_count', 'integer')
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('updated_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('submitted_at', 'text')
		.execute();

	await db.schema
		.createTable('entry_version')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		// Numbered on approval, so that approved versions of an entry are 1, 2, 3 … without gaps.
		.addColumn('version', 'integer')
		.addColumn('status', 'text', (c) =>
			c
				.notNull()
				.check(
					sql`status in ('draft', 'submitted', 'returned', 'approved', 'rejected', 'withdrawn')`
				)
		)
		.addColumn('data', 'text', (c) => c.notNull())
		.addColumn('change_note', 'text')
		.addColumn('submission_id', 'integer', (c) => c.references('submission.id'))
		.addColumn('based_on_version', 'integer')
		.addColumn('created_by', 'text', (c) => c.references('User.id'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('approved_by', 'text', (c) => c.references('User.id'))
		.addColumn('approved_at', 'text')
		.addUniqueConstraint('entry_version_number_unique', ['entry_id', 'version'])
		.addCheckConstraint(
			'entry_version_numbered_when_approved',
			sql`(status = 'approved') = (version is not null)`
		)
		.execute();
	await db.schema
		.createIndex('entry_version_by_entry')
		.on('entry_version')
		.columns(['entry_id', 'status'])
		.execute();
	await db.schema
		.createIndex('entry_version_by_submission')
		.on('entry_version')
		.column('submission_id')
		.execute();

	// The database itself refuses to change or delete an approved version, whatever the code does.
	await sql`create trigger entry_version_approved_is_immutable
		before update on entry_version
		when old.status = 'approved'
		begin
			select raise(abort, 'approved entry versions are immutable');
		end`.execute(db);
	await sql`create trigger entry_version_approved_is_permanent
		before delete on entry_version
		when old.status = 'approved'
		begin
			select raise(abort, 'approved entry versions cannot be deleted');
		end`.execute(db);

	await db.schema
		.createTable('review')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('submission_id', 'integer', (c) =>
			c.notNull().references('submission.id').onDelete('cascade')
		)
		.addColumn('reviewer_id', 'text', (c) => c.notNull().references('User.id'))
		.addColumn('decision', 'text', (c) =>
			c.notNull().check(sql`decision in ('approve', 'return', 'reject')`)
		)
		.addColumn('comment', 'text')
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('submission_comment')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('submission_id', 'integer', (c) =>
			c.notNull().references('submission.id').onDelete('cascade')
		)
		.addColumn('entry_version_id', 'integer', (c) => c.references('entry_version.id'))
		.addColumn('author_id', 'text', (c) => c.notNull().references('User.id'))
		.addColumn('body', 'text', (c) => c.notNull())
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

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

	await db.schema
		.createTable('calculation')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('slug', 'text', (c) => c.notNull().unique())
		.addColumn('kind', 'text', (c) => c.notNull())
		.addColumn('title', 'text', (c) => c.notNull())
		.addColumn('inputs', 'text', (c) => c.notNull())
		.addColumn('result', 'text', (c) => c.notNull())
		.addColumn('engine_version', 'text', (c) => c.notNull())
		.addColumn('visibility', 'text', (c) =>
			c
				.notNull()
				.defaultTo('public')
				.check(sql`visibility in ('public', 'group', 'private')`)
		)
		.addColumn('created_by', 'text', (c) => c.references('User.id'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('calculation_input')
		.addColumn('calculation_id', 'integer', (c) =>
			c.notNull().references('calculation.id').onDelete('cascade')
		)
		.addColumn('entry_version_id', 'integer', (c) => c.notNull().references('entry_version.id'))
		.addPrimaryKeyConstraint('calculation_input_pk', ['calculation_id', 'entry_version_id'])
		.execute();

	await db.schema
		.createTable('release')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('number', 'integer', (c) => c.notNull().unique())
		.addColumn('title', 'text', (c) => c.notNull())
		.addColumn('notes', 'text')
		.addColumn('entry_count', 'integer', (c) => c.notNull())
		.addColumn('manifest_sha256', 'text', (c) => c.notNull())
		.addColumn('created_by', 'text', (c) => c.references('User.id'))
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('release_entry')
		.addColumn('release_id', 'integer', (c) =>
			c.notNull().references('release.id').onDelete('cascade')
		)
		.addColumn('entry_version_id', 'integer', (c) => c.notNull().references('entry_version.id'))
		.addPrimaryKeyConstraint('release_entry_pk', ['release_id', 'entry_version_id'])
		.execute();

	await db.schema
		.createTable('audit_log')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('actor_id', 'text', (c) => c.references('User.id'))
		.addColumn('action', 'text', (c) => c.notNull())
		.addColumn('entry_id', 'integer', (c) => c.references('entry.id'))
		.addColumn('submission_id', 'integer', (c) => c.references('submission.id'))
		.addColumn('before', 'text')
		.addColumn('after', 'text')
		.addColumn('detail', 'text')
		.execute();
	await db.schema.createIndex('audit_log_by_entry').on('audit_log').column('entry_id').execute();

	await db.schema
		.createTable('saved_search')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('query', 'text', (c) => c.notNull())
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.execute();

	await db.schema
		.createTable('api_token')
		.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
		.addColumn('user_id', 'text', (c) => c.notNull().references('User.id').onDelete('cascade'))
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('token_sha256', 'text', (c) => c.notNull().unique())
		.addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
		.addColumn('last_used_at', 'text')
		.addColumn('revoked_at', 'text')
		.execute();

	// --- Read model: the latest approved version of each entry, as typed columns for filtering. ---
	// Rebuilt from entry_version on approval; never edited by hand. `revision` feeds the search index.
	await db.schema
		.createTable('catalogue_state')
		.addColumn('id', 'integer', (c) => c.primaryKey().check(sql`id = 1`))
		.addColumn('revision', 'integer', (c) => c.notNull())
		.execute();
	await db.insertInto('catalogue_state').values({ id: 1, revision: 0 }).execute();

	await db.schema
		.createTable('source')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('source_kind', 'text', (c) => c.notNull())
		.addColumn('doi', 'text')
		.addColumn('pubmed_id', 'text')
		.addColumn('title', 'text', (c) => c.notNull())
		.addColumn('authors', 'text', (c) => c.notNull())
		.addColumn('journal', 'text')
		.addColumn('year', 'integer')
		.execute();
	await db.schema.createIndex('source_by_doi').on('source').column('doi').execute();

	await db.schema
		.createTable('protein')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('name', 'text', (c) => c.notNull())
		.addColumn('organism', 'text', (c) => c.notNull())
		.addColumn('uniprot', 'text')
		.addColumn('structure_ids', 'text', (c) => c.notNull())
		.addColumn('revision', 'integer', (c) => c.notNull())
		.execute();
	await db.schema.createIndex('protein_by_organism').on('protein').column('organism').execute();

	await db.schema
		.createTable('centre')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('protein_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('label', 'text', (c) => c.notNull())
		.addColumn('cofactor_kind', 'text', (c) => c.notNull())
		.addColumn('ligation', 'text')
		.addColumn('chain_id', 'text')
		.addColumn('residues', 'text', (c) => c.notNull())
		.addColumn('revision', 'integer', (c) => c.notNull())
		.execute();
	await db.schema
		.createIndex('centre_by_protein')
		.on('centre')
		.column('protein_entry_id')
		.execute();
	await db.schema.createIndex('centre_by_kind').on('centre').column('cofactor_kind').execute();
	await db.schema.createIndex('centre_by_revision').on('centre').column('revision').execute();

	// Potentials are the rows people search, so their read model also carries what the search
	// filters and sorts on (centre, protein, organism) and when the row became visible to all,
	// so that a search touches one table. Kept in step by the projection on every approval.
	await db.schema
		.createTable('potential')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('accession', 'text', (c) => c.notNull())
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('centre_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('centre_accession', 'text', (c) => c.notNull())
		.addColumn('centre_label', 'text', (c) => c.notNull())
		.addColumn('cofactor_kind', 'text', (c) => c.notNull())
		.addColumn('protein_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('protein_accession', 'text', (c) => c.notNull())
		.addColumn('protein_name', 'text', (c) => c.notNull())
		.addColumn('organism', 'text', (c) => c.notNull())
		.addColumn('couple', 'text', (c) => c.notNull())
		.addColumn('em_mv_she', 'real', (c) => c.notNull())
		.addColumn('reported_value', 'real', (c) => c.notNull())
		.addColumn('reported_unit', 'text', (c) => c.notNull())
		.addColumn('reference_electrode', 'text', (c) => c.notNull())
		.addColumn('ph', 'real')
		.addColumn('temperature_k', 'real')
		.addColumn('ionic_strength_m', 'real')
		.addColumn('buffer', 'text')
		.addColumn('method', 'text', (c) => c.notNull())
		.addColumn('n_electrons', 'integer', (c) => c.notNull())
		.addColumn('uncertainty_mv', 'real')
		.addColumn('source_entry_id', 'integer', (c) => c.references('entry.id'))
		.addColumn('is_demo', 'integer', (c) => c.notNull())
		// When the potential, its centre and its protein are all visible to everyone (ISO 8601);
		// null while any of them is group-only. Group members also see rows of group_id.
		.addColumn('public_from', 'text')
		.addColumn('group_id', 'integer', (c) => c.references('research_group.id'))
		.execute();
	// Lookups by centre, protein and accession, and one index per text sort order of the
	// in-memory search (src/lib/server/search/potentialIndex.ts), which reads each order once
	// per rebuild; the row id (entry_id) breaks ties.
	const potentialIndexes: [string, string[]][] = [
		['potential_by_centre', ['centre_entry_id']],
		['potential_by_protein', ['protein_entry_id']],
		['potential_by_accession', ['accession']],
		['potential_order_protein', ['protein_name', 'centre_label', 'couple']],
		['potential_order_centre', ['centre_label', 'protein_name']],
		['potential_order_kind', ['cofactor_kind', 'protein_name', 'centre_label']],
		['potential_order_couple', ['couple']],
		['potential_order_method', ['method']],
		// Covers the columns the in-memory search index loads, so a rebuild reads this narrow
		// index instead of the wide rows.
		[
			'potential_search_columns',
			[
				'centre_entry_id',
				'protein_entry_id',
				'em_mv_she',
				'ph',
				'temperature_k',
				'cofactor_kind',
				'method',
				'organism',
				'public_from',
				'group_id'
			]
		]
	];
	for (const [name, columns] of potentialIndexes) {
		await db.schema.createIndex(name).on('potential').columns(columns).execute();
	}

	await db.schema
		.createTable('spin_record')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('centre_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('oxidation_level', 'text', (c) => c.notNull())
		.addColumn('spin_s', 'real', (c) => c.notNull())
		.addColumn('g_values', 'text', (c) => c.notNull())
		.addColumn('temperature_k', 'real')
		.addColumn('method', 'text', (c) => c.notNull())
		.addColumn('source_entry_id', 'integer', (c) => c.references('entry.id'))
		.execute();
	await db.schema
		.createIndex('spin_record_by_centre')
		.on('spin_record')
		.column('centre_entry_id')
		.execute();

	await db.schema
		.createTable('distance')
		.addColumn('entry_id', 'integer', (c) => c.primaryKey().references('entry.id'))
		.addColumn('version', 'integer', (c) => c.notNull())
		.addColumn('centre_a_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('centre_b_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
		.addColumn('edge_to_edge_a', 'real', (c) => c.notNull())
		.addColumn('centre_to_centre_a', 'real')
		.addColumn('structure_id', 'text', (c) => c.notNull())
		.addColumn('method', 'text', (c) => c.notNull())
		.addColumn('source_entry_id', 'integer', (c) => c.references('entry.id'))
		.execute();
	await db.schema.createIndex('distance_by_a').on('distance').column('centre_a_entry_id').execute();
	await db.schema.createIndex('distance_by_b').on('distance').column('centre_b_entry_id').execute();
}

export async function down(): Promise<void> {
	throw new Error('0001 is the base schema; restore from a backup instead of migrating down.');
}
