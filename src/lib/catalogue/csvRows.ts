import type { CentreDto, DistanceDto, PotentialDto, ProteinDto, SpinRecordDto } from './dto';

/*
 * Flat CSV rows for the API's `?format=csv`. Column names carry their units; values are
 * normalised (mV vs SHE, K, Å) next to the value as reported.
 */

export function potentialCsvRow(p: PotentialDto): Record<string, unknown> {
	return {
		accession: p.accession,
		version: p.version,
		protein_accession: p.protein.accession,
		protein: p.protein.name,
		organism: p.protein.organism,
		centre_accession: p.centre.accession,
		centre: p.centre.label,
		cofactor_kind: p.centre.cofactorKind,
		couple: p.couple,
		em_mv_vs_she: p.emMvShe,
		reported_value: p.reported.value,
		reported_unit: p.reported.unit,
		reference_electrode: p.reported.referenceElectrode,
		ph: p.ph,
		temperature_k: p.temperatureK,
		ionic_strength_m: p.ionicStrengthM,
		buffer: p.buffer,
		method: p.method,
		n_electrons: p.nElectrons,
		uncertainty_mv: p.uncertaintyMv,
		source_accession: p.source?.accession ?? null,
		source_doi: p.source?.doi ?? null,
		demo_data: p.isDemo
	};
}

export function proteinCsvRow(p: ProteinDto): Record<string, unknown> {
	return {
		accession: p.accession,
		version: p.version,
		name: p.name,
		organism: p.organism,
		uniprot: p.uniprot,
		structure_ids: p.structureIds.join(' '),
		centre_count: p.centreCount,
		demo_data: p.isDemo
	};
}

export function centreCsvRow(c: CentreDto): Record<string, unknown> {
	return {
		accession: c.accession,
		version: c.version,
		protein_accession: c.protein.accession,
		protein: c.protein.name,
		organism: c.protein.organism,
		label: c.label,
		cofactor_kind: c.cofactorKind,
		ligation: c.ligation,
		chain: c.chainId,
		residues: c.residues.join(' '),
		demo_data: c.isDemo
	};
}

export function spinRecordCsvRow(r: SpinRecordDto): Record<string, unknown> {
	return {
		accession: r.accession,
		version: r.version,
		protein_accession: r.protein.accession,
		centre_accession: r.centre.accession,
		centre: r.centre.label,
		cofactor_kind: r.centre.cofactorKind,
		oxidation_level: r.oxidationLevel,
		spin_s: r.spinS,
		g1: r.gValues[0] ?? null,
		g2: r.gValues[1] ?? null,
		g3: r.gValues[2] ?? null,
		temperature_k: r.temperatureK,
		method: r.method,
		source_accession: r.source?.accession ?? null,
		demo_data: r.isDemo
	};
}

export function distanceCsvRow(d: DistanceDto): Record<string, unknown> {
	return {
		accession: d.accession,
		version: d.version,
		protein_accession: d.protein.accession,
		centre_a_accession: d.centreA.accession,
		centre_a: d.centreA.label,
		centre_b_accession: d.centreB.accession,
		centre_b: d.centreB.label,
		edge_to_edge_a: d.edgeToEdgeA,
		centre_to_centre_a: d.centreToCentreA,
		structure_id: d.structureId,
		method: d.method,
		source_accession: d.source?.accession ?? null,
		demo_data: d.isDemo
	};
}
