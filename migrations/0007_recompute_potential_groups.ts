import type { Kysely } from 'kysely';

/*
 * Potential rows carry one `group_id`: the group whose members see the row before its
 * `public_from`. Up to migration 0006 it was the first group found along potential → centre →
 * protein, so a group-1 potential on a group-2-only protein was listed to group 1 with the
 * protein's name. The rule since (`earlyGroup`, catalogue/visibility.ts): the one group that
 * every entry still hidden carries, else none. This recomputes every row by that rule, written
 * out here because a migration must mean the same thing forever, and moves the catalogue
 * revision so that search indexes and kept answers of running processes refresh.
 */

interface ChainEntry {
	visibility: string;
	embargo_until: string | null;
	group_id: number | null;
}

/** The rule as of this migration (see the comment above). */
function earlyGroup(entries: ChainEntry[], nowIso: string): number | null {
	let group: number | null = null;
	for (const e of entries) {
		if (e.visibility === 'public') continue;
		if (e.visibility === 'embargoed' && e.embargo_until !== null && e.embargo_until <= nowIso)
			continue;
		if (e.group_id === null) return null;
		if (group !== null && group !== e.group_id) return null;
		group = e.group_id;
	}
	return group;
}

const PAGE = 1000;

export async function up(db: Kysely<any>): Promise<void> {
	const nowIso = new Date().toISOString();
	await db.transaction().execute(async (trx) => {
		let after = 0;
		for (;;) {
			const rows = await trx
				.selectFrom('potential as p')
				.innerJoin('entry as e', 'e.id', 'p.entry_id')
				.innerJoin('centre as c', 'c.entry_id', 'p.centre_entry_id')
				.innerJoin('entry as ce', 'ce.id', 'c.entry_id')
				.innerJoin('entry as pe', 'pe.id', 'c.protein_entry_id')
				.select([
					'p.entry_id',
					'p.group_id',
					'e.visibility as e_visibility',
					'e.embargo_until as e_embargo',
					'e.group_id as e_group',
					'ce.visibility as ce_visibility',
					'ce.embargo_until as ce_embargo',
					'ce.group_id as ce_group',
					'pe.visibility as pe_visibility',
					'pe.embargo_until as pe_embargo',
					'pe.group_id as pe_group'
				])
				.where('p.entry_id', '>', after)
				.orderBy('p.entry_id')
				.limit(PAGE)
				.execute();
			for (const r of rows) {
				const group = earlyGroup(
					[
						{ visibility: r.e_visibility, embargo_until: r.e_embargo, group_id: r.e_group },
						{ visibility: r.ce_visibility, embargo_until: r.ce_embargo, group_id: r.ce_group },
						{ visibility: r.pe_visibility, embargo_until: r.pe_embargo, group_id: r.pe_group }
					],
					nowIso
				);
				if (group !== r.group_id)
					await trx
						.updateTable('potential')
						.set({ group_id: group })
						.where('entry_id', '=', r.entry_id)
						.execute();
			}
			if (rows.length < PAGE) break;
			after = (rows[rows.length - 1] as { entry_id: number }).entry_id;
		}
		await trx
			.updateTable('catalogue_state')
			.set((eb) => ({ revision: eb('revision', '+', 1) }))
			.where('id', '=', 1)
			.execute();
	});
}

// A return to the first-group rule would reopen the leak: there is no way down.
