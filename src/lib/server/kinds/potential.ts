import type { Kysely } from 'kysely';
import { COUPLES_BY_KIND, type CofactorKind } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import { InvalidEntryDataError } from '../catalogue/errors';
import { potentialContext } from '../catalogue/potentialRows';
import { conflictWarning, potentialConflict } from '$lib/catalogue/conflicts';
import { checkTypicalRange } from '$lib/catalogue/typicalRanges';
import { UPLOAD_COLUMNS } from '$lib/catalogue/uploadColumns';
import { potentialIsVisible } from '../catalogue/visibility';
import { PAGE, paged, type CentreFact } from '../uploads/lookups';
import { matchOption } from '../uploads/cells';
import { findCentre, firstInFile } from '../uploads/rows';
import { defineUpload, upsertReadModel, type KindOnServer } from './kind';
import type { PotentialUnit } from '$lib/science/units';
import type { ReferenceElectrode } from '$lib/science/referenceElectrodes';
import type { PotentialMethod } from '$lib/schemas/vocabulary';

/** The kind's read-model table (see KindTables in db/schema.ts). */
export interface PotentialTable {
	entry_id: number;
	accession: string;
	version: number;
	centre_entry_id: number;
	centre_accession: string;
	centre_label: string;
	cofactor_kind: CofactorKind;
	protein_entry_id: number;
	protein_accession: string;
	protein_name: string;
	organism: string;
	couple: string;
	em_mv_she: number;
	reported_value: number;
	reported_unit: PotentialUnit;
	reference_electrode: ReferenceElectrode;
	ph: number | null;
	temperature_k: number | null;
	ionic_strength_m: number | null;
	buffer: string | null;
	method: PotentialMethod;
	n_electrons: number;
	uncertainty_mv: number | null;
	source_entry_id: number | null;
	is_demo: number;
	/** ISO 8601 time from which everyone may see the row; null while group-only. */
	public_from: string | null;
	group_id: number | null;
}

declare module '../db/schema' {
	interface KindTables {
		potential: PotentialTable;
	}
}

/** An approved potential a row could repeat or contradict. */
interface ApprovedPotential {
	accession: string;
	couple: string;
	emMvShe: number;
	uncertaintyMv: number | null;
	ph: number | null;
	temperatureK: number | null;
	method: string;
}

const ELECTRODE_OPTIONS =
	UPLOAD_COLUMNS.potential.find((c) => c.name === 'referenceElectrode')?.options ?? [];

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
	const misfit = coupleMisfit(centre.cofactor_kind, couple);
	if (misfit) throw new InvalidEntryDataError('couple', misfit);
}

/** Why a couple cannot be one of a centre of this cofactor kind ('other' takes any), or null. */
function coupleMisfit(kind: CofactorKind, couple: string): string | null {
	const allowed = COUPLES_BY_KIND[kind];
	return allowed.length > 0 && !allowed.includes(couple)
		? `"${couple}" is not a couple of a ${kind} centre; expected one of ${allowed.join(', ')}`
		: null;
}

export const potential: KindOnServer<'potential'> = {
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
	title: (d, refs) =>
		refs.centreAccession
			? `Em of ${d.couple}, centre ${refs.centreAccession.label}`
			: `Em of ${d.couple}`,
	potentialRowsColumn: 'entry_id',
	async checkReferences(db, data, refs) {
		if (refs.centreAccession !== undefined)
			await assertCoupleFitsCentre(db, refs.centreAccession, data.couple);
	},
	upload: defineUpload({
		async loadExisting(db, viewer) {
			const byCentreCouple = new Map<string, ApprovedPotential[]>();
			await paged(
				(after) =>
					db
						.selectFrom('potential')
						.select([
							'entry_id',
							'accession',
							'centre_accession',
							'couple',
							'em_mv_she',
							'uncertainty_mv',
							'ph',
							'temperature_k',
							'method'
						])
						.where('entry_id', '>', after)
						.where((eb) => potentialIsVisible(eb, 'potential', viewer))
						.orderBy('entry_id')
						.limit(PAGE)
						.execute(),
				(p) => {
					const key = `${p.centre_accession}|${p.couple}`;
					const list = byCentreCouple.get(key) ?? [];
					list.push({
						accession: p.accession,
						couple: p.couple,
						emMvShe: p.em_mv_she,
						uncertaintyMv: p.uncertainty_mv,
						ph: p.ph,
						temperatureK: p.temperature_k,
						method: p.method
					});
					byCentreCouple.set(key, list);
				}
			);
			return byCentreCouple;
		},
		prepare(r, extras) {
			if (extras.reportedUnit && r.values.reportedUnit === undefined)
				r.values.reportedUnit = extras.reportedUnit;
			if (extras.referenceElectrode && r.values.referenceElectrode === undefined) {
				const m = matchOption(extras.referenceElectrode, ELECTRODE_OPTIONS);
				if (m.ok) r.values.referenceElectrode = m.value;
				else
					r.fail(
						'reportedValue',
						r.texts.reportedValue ?? '',
						`"vs ${extras.referenceElectrode}" names no reference electrode we know${m.suggestion ? `; did you mean "${m.suggestion}"?` : ''}`
					);
			}
		},
		resolve(r) {
			const c = findCentre(r.state, r.values, r.texts, 'centreAccession', 'centreLabel', r.fail);
			return c ? { centres: [c], newProtein: null, proteinEntryId: c.proteinEntryId } : null;
		},
		check(r, d, resolved, existing) {
			const centre = resolved.centres[0] as CentreFact;
			const misfit = coupleMisfit(centre.cofactorKind, d.couple);
			if (misfit) {
				r.fail('couple', d.couple, misfit);
				return false;
			}
			const key = `${d.centreAccession}|${d.couple}|${d.emMvShe}|${d.ph}|${d.temperatureK}|${d.method}`;
			if (!firstInFile(r, key, 'reportedValue')) return false;
			const value = r.texts.reportedValue ?? '';
			const range = checkTypicalRange(centre.cofactorKind, d.couple, d.emMvShe);
			if (range)
				r.warn('range', 'reportedValue', value, range.message, { source: range.range.source });
			for (const p of existing.get(`${d.centreAccession}|${d.couple}`) ?? []) {
				const same =
					Math.abs(p.emMvShe - d.emMvShe) < 0.05 &&
					p.ph === d.ph &&
					p.temperatureK === d.temperatureK &&
					p.method === d.method;
				if (same)
					r.warn('duplicate', 'reportedValue', value, `already in the registry as ${p.accession}`, {
						accession: p.accession
					});
				else {
					// The one rule of entry pages and form checks (conflicts.ts: k = 2, GUM §6.2–6.3);
					// the rule is stored with the warning as its source.
					const c = potentialConflict(d, p);
					if (c) {
						const w = conflictWarning(p, c);
						r.warn('conflict', 'reportedValue', value, w.message, {
							source: w.source,
							accession: w.accession
						});
					}
				}
			}
			return true;
		}
	})
};
