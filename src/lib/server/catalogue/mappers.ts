import type {
	CentreRef,
	DistanceDto,
	PotentialDto,
	ProteinRef,
	SourceRef,
	SpinRecordDto
} from '$lib/catalogue/dto';
import type { CofactorKind } from '$lib/schemas/vocabulary';

/* Row → DTO, one mapper per entity. Column aliases here are the ones the queries select. */

export interface CentreRefColumns {
	centre_accession: string;
	centre_label: string;
	cofactor_kind: string;
}
export interface ProteinRefColumns {
	protein_accession: string;
	protein_name: string;
	organism: string;
}
export interface SourceRefColumns {
	source_accession: string | null;
	source_doi: string | null;
	source_year: number | null;
	source_authors: string | null;
}

export function toProteinRef(r: ProteinRefColumns): ProteinRef {
	return { accession: r.protein_accession, name: r.protein_name, organism: r.organism };
}

export function toCentreRef(r: CentreRefColumns): CentreRef {
	return {
		accession: r.centre_accession,
		label: r.centre_label,
		cofactorKind: r.cofactor_kind as CofactorKind
	};
}

export function toSourceRef(r: SourceRefColumns): SourceRef | null {
	if (r.source_accession === null) return null;
	const authors = r.source_authors ? (JSON.parse(r.source_authors) as string[]) : [];
	return {
		accession: r.source_accession,
		doi: r.source_doi,
		year: r.source_year,
		firstAuthor: authors[0] ?? null
	};
}

export interface PotentialRowColumns extends CentreRefColumns, ProteinRefColumns, SourceRefColumns {
	accession: string;
	version: number;
	couple: string;
	em_mv_she: number;
	reported_value: number;
	reported_unit: string;
	reference_electrode: string;
	ph: number | null;
	temperature_k: number | null;
	ionic_strength_m: number | null;
	buffer: string | null;
	method: string;
	n_electrons: number;
	uncertainty_mv: number | null;
	is_demo: number;
}

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

export interface SpinRecordRowColumns
	extends CentreRefColumns, ProteinRefColumns, SourceRefColumns {
	accession: string;
	version: number;
	oxidation_level: string;
	spin_s: number;
	g_values: string;
	temperature_k: number | null;
	method: string;
	is_demo: number;
}

export function toSpinRecordDto(r: SpinRecordRowColumns): SpinRecordDto {
	return {
		accession: r.accession,
		version: r.version,
		centre: toCentreRef(r),
		protein: toProteinRef(r),
		oxidationLevel: r.oxidation_level,
		spinS: r.spin_s,
		gValues: JSON.parse(r.g_values) as number[],
		temperatureK: r.temperature_k,
		method: r.method,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}

export interface DistanceRowColumns extends ProteinRefColumns, SourceRefColumns {
	accession: string;
	version: number;
	a_accession: string;
	a_label: string;
	a_kind: string;
	b_accession: string;
	b_label: string;
	b_kind: string;
	edge_to_edge_a: number;
	centre_to_centre_a: number | null;
	structure_id: string;
	method: string;
	is_demo: number;
}

export function toDistanceDto(r: DistanceRowColumns): DistanceDto {
	return {
		accession: r.accession,
		version: r.version,
		centreA: toCentreRef({
			centre_accession: r.a_accession,
			centre_label: r.a_label,
			cofactor_kind: r.a_kind
		}),
		centreB: toCentreRef({
			centre_accession: r.b_accession,
			centre_label: r.b_label,
			cofactor_kind: r.b_kind
		}),
		protein: toProteinRef(r),
		edgeToEdgeA: r.edge_to_edge_a,
		centreToCentreA: r.centre_to_centre_a,
		structureId: r.structure_id,
		method: r.method,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}
