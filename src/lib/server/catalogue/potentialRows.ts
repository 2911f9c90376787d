import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { earlyGroup, publicFrom } from './visibility';

/*
 * The columns a potential's read-model row copies from its centre, protein and entries, so that
 * searching potentials touches one table. Computed here and nowhere else.
 */
export type PotentialContext = Pick<
	Database['potential'],
	| 'accession'
	| 'centre_accession'
	| 'centre_label'
	| 'cofactor_kind'
	| 'protein_entry_id'
	| 'protein_accession'
	| 'protein_name'
	| 'organism'
	| 'is_demo'
	| 'public_from'
	| 'group_id'
>;

export async function potentialContext(
	db: Kysely<Database>,
	potentialEntryId: number,
	centreEntryId: number
): Promise<PotentialContext> {
	const row = await db
		.selectFrom('centre as c')
		.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
		.innerJoin('protein as pr', 'pr.entry_id', 'c.protein_entry_id')
		.innerJoin('entry as pe', 'pe.id', 'pr.entry_id')
		.innerJoin('entry as e', (join) => join.on('e.id', '=', potentialEntryId))
		.select([
			'e.accession',
			'e.is_demo',
			'e.visibility as e_visibility',
			'e.embargo_until as e_embargo',
			'e.group_id as e_group',
			'ce.accession as centre_accession',
			'ce.visibility as ce_visibility',
			'ce.embargo_until as ce_embargo',
			'ce.group_id as ce_group',
			'c.label',
			'c.cofactor_kind',
			'pr.entry_id as protein_entry_id',
			'pe.accession as protein_accession',
			'pe.visibility as pe_visibility',
			'pe.embargo_until as pe_embargo',
			'pe.group_id as pe_group',
			'pr.name',
			'pr.organism'
		])
		.where('c.entry_id', '=', centreEntryId)
		.executeTakeFirstOrThrow();
	const chain = [
		{ visibility: row.e_visibility, embargo_until: row.e_embargo, group_id: row.e_group },
		{ visibility: row.ce_visibility, embargo_until: row.ce_embargo, group_id: row.ce_group },
		{ visibility: row.pe_visibility, embargo_until: row.pe_embargo, group_id: row.pe_group }
	];
	return {
		accession: row.accession,
		centre_accession: row.centre_accession,
		centre_label: row.label,
		cofactor_kind: row.cofactor_kind,
		protein_entry_id: row.protein_entry_id,
		protein_accession: row.protein_accession,
		protein_name: row.name,
		organism: row.organism,
		is_demo: row.is_demo,
		public_from: publicFrom(chain),
		group_id: earlyGroup(chain)
	};
}

/**
 * Re-copies centre, protein and visibility columns into the potential rows that depend on an
 * entry which has just changed (a new centre or protein version, a visibility change).
 */
export async function refreshPotentialRows(
	db: Kysely<Database>,
	dependsOn: { column: 'entry_id' | 'centre_entry_id' | 'protein_entry_id'; entryId: number }
): Promise<number> {
	const rows = await db
		.selectFrom('potential')
		.select(['entry_id', 'centre_entry_id'])
		.where(dependsOn.column, '=', dependsOn.entryId)
		.execute();
	for (const row of rows) {
		const context = await potentialContext(db, row.entry_id, row.centre_entry_id);
		await db.updateTable('potential').set(context).where('entry_id', '=', row.entry_id).execute();
	}
	return rows.length;
}
