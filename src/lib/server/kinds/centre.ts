import { COFACTOR_KIND_LABELS } from '$lib/schemas/vocabulary';
import { refreshPotentialRows } from '../catalogue/potentialRows';
import { centreLabelKey } from '../uploads/lookups';
import { firstInFile, resolveCentreProtein } from '../uploads/rows';
import { upsertReadModel, type KindOnServer } from './kind';

export const centre: KindOnServer<'centre'> = {
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
		const kindLabel = COFACTOR_KIND_LABELS[c.cofactor_kind];
		return `${c.label} (${kindLabel}) · ${c.name}`;
	},
	potentialRowsColumn: 'centre_entry_id',
	upload: {
		resolve: (r) => resolveCentreProtein(r.state, r.values, r.texts, r.fail),
		check(r, d, resolved) {
			const proteinKey = resolved.newProtein?.key ?? String(resolved.proteinEntryId);
			if (!firstInFile(r, `${proteinKey}|${d.label.toLowerCase()}`, 'label')) return false;
			if (resolved.proteinEntryId !== null) {
				const existing = r.state.lookups.centresByProteinLabel.get(
					centreLabelKey(resolved.proteinEntryId, d.label)
				);
				if (existing)
					r.warn(
						'duplicate',
						'label',
						d.label,
						`already in the registry as ${existing.accession}`,
						{ accession: existing.accession }
					);
			}
			if (resolved.newProtein) {
				// The protein is created by the first valid row that names it.
				const p = r.state.newProteins.get(resolved.newProtein.key);
				if (p && p.row === 0) p.row = r.row;
			}
			return true;
		}
	}
};
