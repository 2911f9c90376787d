import type {
	CentreRef,
	DistanceDto,
	PotentialDto,
	ProteinRef,
	SourceRef,
	SpinRecordDto
} from '$lib/catalogue/dto';
import type { Selectable } from 'kysely';
import type { CofactorKind } from '$lib/schemas/vocabulary';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';

/* Row → DTO, one mapper per entity. Column aliases here are the ones the queries select. */

/** The selected columns of one table, as Kysely reads them. */
type Row<T extends keyof Database> = Selectable<Database[T]>;

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

export type SpinRecordRowColumns = CentreRefColumns &
	ProteinRefColumns &
	SourceRefColumns &
	Pick<
		Row<'spin_record'>,
		'version' | 'oxidation_level' | 'spin_s' | 'g_values' | 'temperature_k' | 'method'
	> &
	Pick<Row<'entry'>, 'accession' | 'is_demo'>;

export function toSpinRecordDto(r: SpinRecordRowColumns): SpinRecordDto {
	return {
		accession: r.accession,
		version: r.version,
		centre: toCentreRef(r),
		protein: toProteinRef(r),
		oxidationLevel: r.oxidation_level,
		spinS: r.spin_s,
		gValues: readJson(r.g_values),
		temperatureK: r.temperature_k,
		method: r.method,
		source: toSourceRef(r),
		isDemo: r.is_demo === 1
	};
}

export type DistanceRowColumns = ProteinRefColumns &
	SourceRefColumns &
	Pick<
		Row<'distance'>,
		'version' | 'edge_to_edge_a' | 'centre_to_centre_a' | 'structure_id' | 'method'
	> &
	Pick<Row<'entry'>, 'accession' | 'is_demo'> & {
		a_accession: string;
		a_label: string;
		a_kind: CofactorKind;
		b_accession: string;
		b_label: string;
		b_kind: CofactorKind;
	};

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
