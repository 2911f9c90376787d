import type { Kysely } from 'kysely';
import type { EntryData } from '$lib/schemas/entryData';
import type { Database } from '../db/schema';
import { potentialContext, refreshPotentialRows } from './potentialRows';
import { bumpCatalogueRevision } from './revision';
import { assertCoupleFitsCentre, resolveOptionalReference, resolveReference } from './references';

/**
 * Writes the read model (typed columns) for the newly approved version of one entry, and
 * marks what the search index must refresh. Runs inside the approving transaction.
 */
export async function projectApprovedVersion(
	trx: Kysely<Database>,
	entryId: number,
	version: number,
	entry: EntryData
): Promise<void> {
	const revision = await bumpCatalogueRevision(trx);
	switch (entry.kind) {
		case 'source': {
			const d = entry.data;
			const row = {
				version,
				source_kind: d.sourceKind,
				doi: d.doi,
				pubmed_id: d.pubmedId,
				title: d.title,
				authors: JSON.stringify(d.authors),
				journal: d.journal,
				year: d.year
			};
			await trx
				.insertInto('source')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			return;
		}
		case 'protein': {
			const d = entry.data;
			const row = {
				version,
				name: d.name,
				organism: d.organism,
				uniprot: d.uniprot,
				structure_ids: JSON.stringify(d.structureIds),
				revision
			};
			await trx
				.insertInto('protein')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			// Centres carry their protein's name in the search index, potentials in their rows.
			await trx
				.updateTable('centre')
				.set({ revision })
				.where('protein_entry_id', '=', entryId)
				.execute();
			await refreshPotentialRows(trx, { column: 'protein_entry_id', entryId });
			return;
		}
		case 'centre': {
			const d = entry.data;
			const proteinId = await resolveReference(
				trx,
				'proteinAccession',
				d.proteinAccession,
				'protein'
			);
			const row = {
				version,
				protein_entry_id: proteinId,
				label: d.label,
				cofactor_kind: d.cofactorKind,
				ligation: d.ligation,
				chain_id: d.chainId,
				residues: JSON.stringify(d.residues),
				revision
			};
			await trx
				.insertInto('centre')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			await refreshPotentialRows(trx, { column: 'centre_entry_id', entryId });
			return;
		}
		case 'potential': {
			const d = entry.data;
			const centreId = await resolveReference(trx, 'centreAccession', d.centreAccession, 'centre');
			await assertCoupleFitsCentre(trx, centreId, d.couple);
			const row = {
				version,
				centre_entry_id: centreId,
				couple: d.couple,
				em_mv_she: d.emMvShe,
				reported_value: d.reportedValue,
				reported_unit: d.reportedUnit,
				reference_electrode: d.referenceElectrode,
				ph: d.ph,
				temperature_k: d.temperatureK,
				ionic_strength_m: d.ionicStrengthM,
				buffer: d.buffer,
				method: d.method,
				n_electrons: d.nElectrons,
				uncertainty_mv: d.uncertaintyMv,
				source_entry_id: await resolveOptionalReference(
					trx,
					'sourceAccession',
					d.sourceAccession,
					'source'
				),
				...(await potentialContext(trx, entryId, centreId))
			};
			await trx
				.insertInto('potential')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			return;
		}
		case 'spin_record': {
			const d = entry.data;
			const row = {
				version,
				centre_entry_id: await resolveReference(
					trx,
					'centreAccession',
					d.centreAccession,
					'centre'
				),
				oxidation_level: d.oxidationLevel,
				spin_s: d.spinS,
				g_values: JSON.stringify([...d.gValues].sort((a, b) => b - a)),
				temperature_k: d.temperatureK,
				method: d.method,
				source_entry_id: await resolveOptionalReference(
					trx,
					'sourceAccession',
					d.sourceAccession,
					'source'
				)
			};
			await trx
				.insertInto('spin_record')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			return;
		}
		case 'distance': {
			const d = entry.data;
			const row = {
				version,
				centre_a_entry_id: await resolveReference(
					trx,
					'centreAAccession',
					d.centreAAccession,
					'centre'
				),
				centre_b_entry_id: await resolveReference(
					trx,
					'centreBAccession',
					d.centreBAccession,
					'centre'
				),
				edge_to_edge_a: d.edgeToEdgeA,
				centre_to_centre_a: d.centreToCentreA,
				structure_id: d.structureId,
				method: d.method,
				source_entry_id: await resolveOptionalReference(
					trx,
					'sourceAccession',
					d.sourceAccession,
					'source'
				)
			};
			await trx
				.insertInto('distance')
				.values({ entry_id: entryId, ...row })
				.onConflict((oc) => oc.column('entry_id').doUpdateSet(row))
				.execute();
			return;
		}
	}
}
