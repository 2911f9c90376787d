import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { upsertReadModel, type KindOnServer } from './kind';

export const protein: KindOnServer<'protein'> = {
	async project(trx, { entryId, version, revision, data: d }) {
		await upsertReadModel(trx, 'protein', entryId, {
			version,
			name: d.name,
			organism: d.organism,
			uniprot: d.uniprot,
			structure_ids: JSON.stringify(d.structureIds),
			revision
		});
		// Centres carry their protein's name in the search index, potentials in their rows.
		await trx
			.updateTable('centre')
			.set({ revision })
			.where('protein_entry_id', '=', entryId)
			.execute();
		await refreshPotentialRows(trx, { column: 'protein_entry_id', entryId });
	},
	dependsOn: async () => [],
	async title(db: Kysely<Database>, entryId) {
		const p = await db
			.selectFrom('protein')
			.select('name')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return p?.name ?? 'Protein';
	},
	potentialRowsColumn: 'protein_entry_id'
};
