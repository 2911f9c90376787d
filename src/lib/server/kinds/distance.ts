import { findCentre, firstInFile } from '../uploads/rows';
import { entryIsVisible } from '../catalogue/visibility';
import { PAGE, centreAccessionsById, paged } from '../uploads/lookups';
import { defineUpload, upsertReadModel, type KindOnServer } from './kind';

/** What makes two distances the same: the pair in either order, and the structure. */
const distanceKey = (a: string, b: string, structure: string) =>
	`${a < b ? a : b}|${a < b ? b : a}|${structure.toLowerCase()}`;

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
	upload: defineUpload({
		async loadExisting(db, viewer, shared) {
			const accessionOf = centreAccessionsById(shared);
			const existing = new Map<string, string>();
			await paged(
				(after) =>
					db
						.selectFrom('distance')
						.innerJoin('entry', 'entry.id', 'distance.entry_id')
						.select([
							'distance.entry_id',
							'entry.accession',
							'distance.centre_a_entry_id',
							'distance.centre_b_entry_id',
							'distance.structure_id'
						])
						.where('distance.entry_id', '>', after)
						.where((eb) => entryIsVisible(eb, 'entry', viewer))
						.orderBy('distance.entry_id')
						.limit(PAGE)
						.execute(),
				(row) =>
					existing.set(
						distanceKey(
							accessionOf.get(row.centre_a_entry_id) ?? '',
							accessionOf.get(row.centre_b_entry_id) ?? '',
							row.structure_id
						),
						row.accession
					)
			);
			return existing;
		},
		resolve(r) {
			const a = findCentre(r.state, r.values, r.texts, 'centreAAccession', 'centreALabel', r.fail);
			const b = findCentre(r.state, r.values, r.texts, 'centreBAccession', 'centreBLabel', r.fail);
			return a && b
				? { centres: [a, b], newProtein: null, proteinEntryId: a.proteinEntryId }
				: null;
		},
		check(r, d, _resolved, registry) {
			const key = distanceKey(d.centreAAccession, d.centreBAccession, d.structureId);
			if (!firstInFile(r, key, 'edgeToEdgeA')) return false;
			const existing = registry.get(key);
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
	})
};
