import { upsertReadModel, type ServerKindModule } from './kind';

export const distance: ServerKindModule<'distance'> = {
	async project(trx, { entryId, version, data: d, refs }) {
		await upsertReadModel(trx, 'distance', entryId, {
			version,
			centre_a_entry_id: refs.centreAAccession as number,
			centre_b_entry_id: refs.centreBAccession as number,
			edge_to_edge_a: d.edgeToEdgeA,
			centre_to_centre_a: d.centreToCentreA,
			structure_id: d.structureId,
			method: d.method,
			source_entry_id: refs.sourceAccession ?? null
		});
	},
	async dependsOn(db, entryId) {
		const d = await db
			.selectFrom('distance')
			.select(['centre_a_entry_id', 'centre_b_entry_id'])
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return d
			? [
					{ id: d.centre_a_entry_id, kind: 'centre' },
					{ id: d.centre_b_entry_id, kind: 'centre' }
				]
			: [];
	},
	async title(db, entryId) {
		const d = await db
			.selectFrom('distance')
			.innerJoin('centre as a', 'a.entry_id', 'distance.centre_a_entry_id')
			.innerJoin('centre as b', 'b.entry_id', 'distance.centre_b_entry_id')
			.select(['a.label as a', 'b.label as b'])
			.where('distance.entry_id', '=', entryId)
			.executeTakeFirst();
		return d ? `Distance ${d.a} – ${d.b}` : 'Distance';
	},
	potentialRowsColumn: null
};
