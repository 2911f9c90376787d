import type { Kysely } from 'kysely';
import { COUPLES_BY_KIND, type CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { InvalidEntryDataError } from '../catalogue/errors';
import { potentialContext } from '../catalogue/potentialRows';
import { upsertReadModel, type ServerKindModule } from './kind';

/** A potential's couple must be one its centre's cofactor kind can have ('other' takes any). */
async function assertCoupleFitsCentre(
	db: Kysely<Database>,
	centreEntryId: number,
	couple: string
): Promise<void> {
	const centre = await db
		.selectFrom('centre')
		.select('cofactor_kind')
		.where('entry_id', '=', centreEntryId)
		.executeTakeFirstOrThrow();
	const allowed = COUPLES_BY_KIND[centre.cofactor_kind as CofactorKind] ?? [];
	if (allowed.length > 0 && !allowed.includes(couple)) {
		throw new InvalidEntryDataError(
			'couple',
			`"${couple}" is not a couple of a ${centre.cofactor_kind} centre; expected one of ${allowed.join(', ')}`
		);
	}
}

export const potential: ServerKindModule<'potential'> = {
	async project(trx, { entryId, version, data: d, refs }) {
		const centreId = refs.centreAccession as number;
		await assertCoupleFitsCentre(trx, centreId, d.couple);
		await upsertReadModel(trx, 'potential', entryId, {
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
			source_entry_id: refs.sourceAccession ?? null,
			...(await potentialContext(trx, entryId, centreId))
		});
	},
	async dependsOn(db, entryId) {
		const p = await db
			.selectFrom('potential')
			.select('centre_entry_id')
			.where('entry_id', '=', entryId)
			.executeTakeFirst();
		return p ? [{ id: p.centre_entry_id, kind: 'centre' }] : [];
	},
	async title(db, entryId) {
		const p = await db
			.selectFrom('potential')
			.innerJoin('centre', 'centre.entry_id', 'potential.centre_entry_id')
			.select(['potential.couple', 'centre.label'])
			.where('potential.entry_id', '=', entryId)
			.executeTakeFirst();
		return p ? `Em of ${p.couple}, centre ${p.label}` : 'Potential';
	},
	potentialRowsColumn: 'entry_id',
	async checkReferences(db, data, refs) {
		if (refs.centreAccession !== undefined)
			await assertCoupleFitsCentre(db, refs.centreAccession, data.couple);
	}
};
