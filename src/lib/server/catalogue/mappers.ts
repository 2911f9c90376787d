import type { CentreRef, PotentialDto, ProteinRef, SourceRef } from '$lib/catalogue/dto';
import { readJson } from '../db/json';
import type { Row } from '../db/schema';

/*
 * Row → DTO for the references every list carries (protein, centre, source) and for potentials;
 * the lists of other kinds map their rows in their own modules (src/lib/server/kinds).
 */

export interface CentreRefColumns {
	centre_accession: string;
	centre_label: Row<'centre'>['label'];
	cofactor_kind: Row<'centre'>['cofactor_kind'];
}
export type ProteinRefColumns = Pick<
	Row<'potential'>,
	'protein_accession' | 'protein_name' | 'organism'
>;
/** A source joined on the left: every column null when the row names none (or none visible). */
export interface SourceRefColumns {
	source_accession: string | null;
	source_doi: Row<'source'>['doi'];
	source_year: Row<'source'>['year'];
	source_authors: Row<'source'>['authors'] | null;
}

export function toProteinRef(r: ProteinRefColumns): ProteinRef {
	return { accession: r.protein_accession, name: r.protein_name, organism: r.organism };
}

export function toCentreRef(r: CentreRefColumns): CentreRef {
	return {
		accession: r.centre_accession,
		label: r.centre_label,
		cofactorKind: r.cofactor_kind
	};
}

export function toSourceRef(r: SourceRefColumns): SourceRef | null {
	if (r.source_accession === null) return null;
	const authors = r.source_authors ? readJson(r.source_authors) : [];
	return {
		accession: r.source_accession,
		doi: r.source_doi,
		year: r.source_year,
		firstAuthor: authors[0] ?? null
	};
}

export type PotentialRowColumns = SourceRefColumns &
	Pick<
		Row<'potential'>,
		| 'accession'
		| 'version'
		| 'centre_accession'
		| 'centre_label'
		| 'cofactor_kind'
		| 'protein_accession'
		| 'protein_name'
		| 'organism'
		| 'couple'
		| 'em_mv_she'
		| 'reported_value'
		| 'reported_unit'
		| 'reference_electrode'
		| 'ph'
		| 'temperature_k'
		| 'ionic_strength_m'
		| 'buffer'
		| 'method'
		| 'n_electrons'
		| 'uncertainty_mv'
		| 'is_demo'
	>;

export function toPotentialDto(r: PotentialRowColumns): PotentialDto {
	return {
		accession: r.accession,
		version: r.version,
		centre: toCentreRef(r),
		protein: toProteinRef(r),
		couple: r.couple,
		emMvShe: r.em_mv_she,
		reported: {
			value: r.reported_value,
			unit: r.reported_unit,
			referenceElectrode: r.reference_electrode
		},
		ph: r.ph,
		temperatureK: r.temperature_k,
		ionicStrengthM: r.ionic_strength_m,
		buffer: r.buffer,
		method: r.method,
		nElectrons: r.n_electrons,
		uncertaintyMv: r.uncertainty_mv,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}
