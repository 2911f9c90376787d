import { sql, type Kysely } from 'kysely';

/*
 * A version is cited as it was approved, with everything it names: a centre's version 1 names
 * its protein as the protein stood when the centre was approved, not as it was renamed later.
 * `entry_version_reference` holds, for each approved version, the exact (entry, version) each of
 * its reference fields resolved to. From this migration on the approval writes these rows in its
 * own transaction (catalogue/projection.ts); the database refuses to change or delete them, as
 * it refuses to change an approved version (migration 0001).
 *
 * Versions approved before this migration get their rows here, by this rule, written out so that
 * it means the same thing forever: a reference field's accession resolves to the referenced
 * entry's latest version whose approval time is at or before the referencing version's approval
 * time (the approval stores ISO 8601 UTC times, which compare as text). That is the version the
 * approval saw: an approval resolves references against the versions approved before it, and
 * one in the same transaction (a batch's protein before its centres) is approved earlier within
 * it. Should no version of the referenced entry be approved by then (only a clock set back, or
 * data written by hand, can do that), its first approved version is pinned: the nearest in time
 * to what the approval can have seen. A reference whose accession names no entry (the approval
 * refuses those) gets no row. The reference fields, as the kinds define them at this migration:
 */
const REFERENCE_FIELDS: [kind: string, field: string][] = [
	['centre', 'proteinAccession'],
	['potential', 'centreAccession'],
	['potential', 'sourceAccession'],
	['spin_record', 'centreAccession'],
	['spin_record', 'sourceAccession'],
	['distance', 'centreAAccession'],
	['distance', 'centreBAccession'],
	['distance', 'sourceAccession']
];

export async function up(db: Kysely<any>): Promise<void> {
	await db.transaction().execute(async (trx) => {
		await trx.schema
			.createTable('entry_version_reference')
			.addColumn('entry_version_id', 'integer', (c) => c.notNull().references('entry_version.id'))
			.addColumn('field', 'text', (c) => c.notNull())
			.addColumn('referenced_entry_id', 'integer', (c) => c.notNull().references('entry.id'))
			.addColumn('referenced_version', 'integer', (c) => c.notNull())
			.addPrimaryKeyConstraint('entry_version_reference_pk', ['entry_version_id', 'field'])
			// The pinned version exists: (entry_id, version) is unique in entry_version.
			.addForeignKeyConstraint(
				'entry_version_reference_version_fk',
				['referenced_entry_id', 'referenced_version'],
				'entry_version',
				['entry_id', 'version']
			)
			.execute();
		// Which versions cite a given version (and the foreign key checks of entry_version).
		await trx.schema
			.createIndex('entry_version_reference_by_referenced')
			.on('entry_version_reference')
			.columns(['referenced_entry_id', 'referenced_version'])
			.execute();
		await sql`create trigger entry_version_reference_is_immutable
			before update on entry_version_reference
			begin
				select raise(abort, 'the references of an approved version are immutable');
			end`.execute(trx);
		await sql`create trigger entry_version_reference_is_permanent
			before delete on entry_version_reference
			begin
				select raise(abort, 'the references of an approved version cannot be deleted');
			end`.execute(trx);

		const fields = sql.join(
			REFERENCE_FIELDS.map(([kind, field]) => sql`(${kind}, ${field}, ${'$.' + field})`)
		);
		await sql`
			with reference_field(kind, field, path) as (values ${fields})
			insert into entry_version_reference
				(entry_version_id, field, referenced_entry_id, referenced_version)
			select v.id, f.field, r.id,
				coalesce(
					(select max(rv.version) from entry_version rv
						where rv.entry_id = r.id and rv.status = 'approved'
							and rv.approved_at <= v.approved_at),
					(select min(rv.version) from entry_version rv
						where rv.entry_id = r.id and rv.status = 'approved')
				)
			from entry_version v
			join entry e on e.id = v.entry_id
			join reference_field f on f.kind = e.kind
			join entry r on r.accession = json_extract(v.data, f.path)
			where v.status = 'approved'
				and exists (select 1 from entry_version a where a.entry_id = r.id and a.status = 'approved')
		`.execute(trx);

		// Entry pages now read their titles from the pinned versions: answers kept for the old
		// revision must go.
		await trx
			.updateTable('catalogue_state')
			.set((eb) => ({ revision: eb('revision', '+', 1) }))
			.where('id', '=', 1)
			.execute();
	});
}

export async function down(db: Kysely<any>): Promise<void> {
	// Dropping the table drops its triggers and index with it.
	await db.schema.dropTable('entry_version_reference').execute();
}
