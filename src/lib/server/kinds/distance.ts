import { distanceKey } from '../uploads/lookups';
import { findCentre, firstInFile } from '../uploads/rows';
import { upsertReadModel, type KindOnServer } from './kind';

export const distance: KindOnServer<'distance'> = {
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
	potentialRowsColumn: null,
	upload: {
		resolve(r) {
			const a = findCentre(r.state, r.values, r.texts, 'centreAAccession', 'centreALabel', r.fail);
			const b = findCentre(r.state, r.values, r.texts, 'centreBAccession', 'centreBLabel', r.fail);
			return a && b
				? { centres: [a, b], newProtein: null, proteinEntryId: a.proteinEntryId }
				: null;
		},
		check(r, d) {
			const key = distanceKey(d.centreAAccession, d.centreBAccession, d.structureId);
			if (!firstInFile(r, key, 'edgeToEdgeA')) return false;
			const existing = r.state.lookups.distanceKeys.get(key);
			if (existing)
				r.warn(
					'duplicate',
					'structureId',
					d.structureId,
					`already in the registry as ${existing}`,
					{ accession: existing }
				);
			return true;
		}
	}
};
