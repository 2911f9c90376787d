import { findCentre, firstInFile } from '../uploads/rows';
import { entryIsVisible } from '../catalogue/visibility';
import { PAGE, centreAccessionsById, paged } from '../uploads/lookups';
import { defineUpload, upsertReadModel, type KindOnServer } from './kind';

/** What makes two spin records the same measurement. */
const spinKey = (centre: string, level: string, method: string, t: number | null) =>
	`${centre}|${level}|${method}|${t ?? ''}`;

export const spinRecord: KindOnServer<'spin_record'> = {
	async project(trx, { entryId, version, data: d, refs }) {
		await upsertReadModel(trx, 'spin_record', entryId, {
			version,
			centre_entry_id: refs.centreAccession as number,
			oxidation_level: d.oxidationLevel,
			spin_s: d.spinS,
			// Principal values largest first, whatever order they were typed in.
			g_values: JSON.stringify([...d.gValues].sort((a, b) => b - a)),
			temperature_k: d.temperatureK,
			method: d.method,
			source_entry_id: refs.sourceAccession ?? null
		});
	},
	async dependsOn(db, entryId) {
		const r = await db
			.selectFrom('spin_record')
			.select('centre_entry_id')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return r ? [{ id: r.centre_entry_id, kind: 'centre' }] : [];
	},
	async title(db, entryId) {
		const r = await db
			.selectFrom('spin_record')
			.innerJoin('centre', 'centre.entry_id', 'spin_record.centre_entry_id')
			.select(['spin_record.oxidation_level', 'centre.label'])
			.where('spin_record.entry_id', '=', entryId)
			.executeTakeFirst();
		return r ? `Spin state of ${r.oxidation_level}, centre ${r.label}` : 'Spin record';
	},
	potentialRowsColumn: null,
	upload: defineUpload({
		async loadExisting(db, viewer, shared) {
			const accessionOf = centreAccessionsById(shared);
			const existing = new Map<string, string>();
			await paged(
				(after) =>
					db
						.selectFrom('spin_record')
						.innerJoin('entry', 'entry.id', 'spin_record.entry_id')
						.select([
							'spin_record.entry_id',
							'entry.accession',
							'spin_record.centre_entry_id',
							'spin_record.oxidation_level',
							'spin_record.method',
							'spin_record.temperature_k'
						])
						.where('spin_record.entry_id', '>', after)
						.where((eb) => entryIsVisible(eb, 'entry', viewer))
						.orderBy('spin_record.entry_id')
						.limit(PAGE)
						.execute(),
				(row) =>
					existing.set(
						spinKey(
							accessionOf.get(row.centre_entry_id) ?? '',
							row.oxidation_level,
							row.method,
							row.temperature_k
						),
						row.accession
					)
			);
			return existing;
		},
		resolve(r) {
			const c = findCentre(r.state, r.values, r.texts, 'centreAccession', 'centreLabel', r.fail);
			return c ? { centres: [c], newProtein: null, proteinEntryId: c.proteinEntryId } : null;
		},
		check(r, d, _resolved, registry) {
			const key = spinKey(d.centreAccession, d.oxidationLevel, d.method, d.temperatureK);
			if (!firstInFile(r, key, 'oxidationLevel')) return false;
			const existing = registry.get(key);
			if (existing)
				r.warn(
					'duplicate',
					'oxidationLevel',
					d.oxidationLevel,
					`already in the registry as ${existing}`,
					{ accession: existing }
				);
			return true;
		}
	})
};
