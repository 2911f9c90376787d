import { COFACTOR_KIND_LABELS, type CofactorKind } from '$lib/schemas/vocabulary';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { upsertReadModel, type ServerKindModule } from './kind';

export const centre: ServerKindModule<'centre'> = {
	async project(trx, { entryId, version, revision, data: d, refs }) {
		await upsertReadModel(trx, 'centre', entryId, {
			version,
			protein_entry_id: refs.proteinAccession as number,
			label: d.label,
			cofactor_kind: d.cofactorKind,
			ligation: d.ligation,
			chain_id: d.chainId,
			residues: JSON.stringify(d.residues),
			revision
		});
		await refreshPotentialRows(trx, { column: 'centre_entry_id', entryId });
	},
	async dependsOn(db, entryId) {
		const c = await db
			.selectFrom('centre')
			.select('protein_entry_id')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return c ? [{ id: c.protein_entry_id, kind: 'protein' }] : [];
	},
	async title(db, entryId) {
		const c = await db
			.selectFrom('centre')
			.innerJoin('protein', 'protein.entry_id', 'centre.protein_entry_id')
			.select(['centre.label', 'centre.cofactor_kind', 'protein.name'])
			.where('centre.entry_id', '=', entryId)
			.executeTakeFirst();
		if (!c) return 'Centre';
		const kindLabel = COFACTOR_KIND_LABELS[c.cofactor_kind as CofactorKind] ?? c.cofactor_kind;
		return `${c.label} (${kindLabel}) · ${c.name}`;
	},
	potentialRowsColumn: 'centre_entry_id'
};
