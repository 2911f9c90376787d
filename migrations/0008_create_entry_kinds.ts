import { sql, type Kysely } from 'kysely';

/*
 * The kinds of entry become rows of a table, `entry_kind`, that `entry.kind` references, in
 * place of the CHECK migration 0001 put on `entry.kind` naming the six kinds. SQLite cannot
 * alter a CHECK, so a new kind meant rebuilding `entry`, which 19 foreign keys name; now a new
 * kind's migration inserts its row here and creates its read-model table.
 *
 * `entry` is rebuilt once, by SQLite's documented procedure for changing a table's constraints
 * (sqlite.org/lang_altertable.html, "Making Other Kinds Of Table Schema Changes"): foreign keys
 * off, a new table, copy, drop, rename, check every foreign key, in one transaction. Row ids,
 * and so accessions, are kept, and so is the AUTOINCREMENT counter, so that no accession is
 * ever handed out twice. `entry` has no index or trigger of its own but its UNIQUE accession,
 * which the new table declares again.
 */

const KINDS = ['protein', 'centre', 'potential', 'spin_record', 'distance', 'source'];

const COLUMNS = sql.raw(
	'id, accession, kind, visibility, group_id, embargo_until, is_demo, created_by, created_at, merged_into_entry_id'
);

async function rebuildEntry(db: Kysely<any>, kindColumn: 'references' | 'check'): Promise<void> {
	const now = sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`;
	const list = sql.join(KINDS.map((k) => sql.lit(k)));
	// Foreign keys can only be switched off outside a transaction (and Kysely runs SQLite
	// migrations outside one).
	await sql`pragma foreign_keys = off`.execute(db);
	try {
		await db.transaction().execute(async (trx) => {
			await trx.schema
				.createTable('entry_rebuilt')
				.addColumn('id', 'integer', (c) => c.primaryKey().autoIncrement())
				.addColumn('accession', 'text', (c) => c.notNull().unique())
				.addColumn('kind', 'text', (c) =>
					kindColumn === 'references'
						? c.notNull().references('entry_kind.id')
						: c.notNull().check(sql`kind in (${list})`)
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
				// Becomes entry(id) when the table is renamed below.
				.addColumn('merged_into_entry_id', 'integer', (c) => c.references('entry_rebuilt.id'))
				.execute();
			await sql`insert into entry_rebuilt (${COLUMNS}) select ${COLUMNS} from entry`.execute(trx);
			// The counter may stand above the highest id (an allocation rolled back): keep it.
			await sql`delete from sqlite_sequence where name = 'entry_rebuilt'`.execute(trx);
			await sql`insert into sqlite_sequence (name, seq)
				select 'entry_rebuilt', seq from sqlite_sequence where name = 'entry'`.execute(trx);
			await sql`drop table entry`.execute(trx);
			await sql`alter table entry_rebuilt rename to entry`.execute(trx);
			const broken = await sql`pragma foreign_key_check`.execute(trx);
			if (broken.rows.length > 0)
				throw new Error(`rebuilding entry would break ${broken.rows.length} foreign key(s)`);
		});
	} finally {
		await sql`pragma foreign_keys = on`.execute(db);
	}
}

export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.createTable('entry_kind')
		.addColumn('id', 'text', (c) => c.primaryKey())
		.execute();
	await db
		.insertInto('entry_kind')
		.values(KINDS.map((id) => ({ id })))
		.execute();
	await rebuildEntry(db, 'references');
}

/** Refused (by the CHECK) while an entry of a later kind exists: it would be lost. */
export async function down(db: Kysely<any>): Promise<void> {
	await rebuildEntry(db, 'check');
	await db.schema.dropTable('entry_kind').execute();
}
