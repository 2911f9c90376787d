import type { CentreDto, DistanceDto, PotentialDto, ProteinDto, SpinRecordDto } from './dto';

/*
 * The CSV tables of the API's `?format=csv` and of the search export: each a list of columns
 * with the value each takes from a row, so the header row is known even when no row matches
 * (an empty result is the header alone). Column names carry their units (`_mv_vs_she`, `_k`,
 * `_angstrom`); values are normalised (mV vs SHE, K, Å) next to the value as reported.
 *
 * Cells: numbers as JavaScript writes them (full precision, `.` as the decimal mark), missing
 * values empty, lists space-separated, booleans `TRUE` / `FALSE` (what spreadsheets, R's
 * read.csv and pandas' read_csv all read as booleans).
 */

export interface CsvTable<T> {
	fields: readonly string[];
	row: (item: T) => unknown[];
}

/** One cell as the CSV writer should see it. */
export function csvCell(value: unknown): unknown {
	if (value === null || value === undefined) return null;
	if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
	return value;
}

function table<T>(columns: Record<string, (item: T) => unknown>): CsvTable<T> {
	const getters = Object.values(columns);
	return { fields: Object.keys(columns), row: (item) => getters.map((get) => csvCell(get(item))) };
}

export const POTENTIAL_CSV = table<PotentialDto>({
	accession: (p) => p.accession,
	version: (p) => p.version,
	protein_accession: (p) => p.protein.accession,
	protein: (p) => p.protein.name,
	organism: (p) => p.protein.organism,
	centre_accession: (p) => p.centre.accession,
	centre: (p) => p.centre.label,
	cofactor_kind: (p) => p.centre.cofactorKind,
	couple: (p) => p.couple,
	em_mv_vs_she: (p) => p.emMvShe,
	reported_value: (p) => p.reported.value,
	reported_unit: (p) => p.reported.unit,
	reference_electrode: (p) => p.reported.referenceElectrode,
	ph: (p) => p.ph,
	temperature_k: (p) => p.temperatureK,
	ionic_strength_m: (p) => p.ionicStrengthM,
	buffer: (p) => p.buffer,
	method: (p) => p.method,
	n_electrons: (p) => p.nElectrons,
	uncertainty_mv: (p) => p.uncertaintyMv,
	source_accession: (p) => p.source?.accession,
	source_doi: (p) => p.source?.doi,
	demo_data: (p) => p.isDemo
});

export const PROTEIN_CSV = table<ProteinDto>({
	accession: (p) => p.accession,
	version: (p) => p.version,
	name: (p) => p.name,
	organism: (p) => p.organism,
	uniprot: (p) => p.uniprot,
	structure_ids: (p) => p.structureIds.join(' '),
	centre_count: (p) => p.centreCount,
	demo_data: (p) => p.isDemo
});

export const CENTRE_CSV = table<CentreDto>({
	accession: (c) => c.accession,
	version: (c) => c.version,
	protein_accession: (c) => c.protein.accession,
	protein: (c) => c.protein.name,
	organism: (c) => c.protein.organism,
	label: (c) => c.label,
	cofactor_kind: (c) => c.cofactorKind,
	ligation: (c) => c.ligation,
	chain: (c) => c.chainId,
	residues: (c) => c.residues.join(' '),
	demo_data: (c) => c.isDemo
});

export const SPIN_RECORD_CSV = table<SpinRecordDto>({
	accession: (r) => r.accession,
	version: (r) => r.version,
	protein_accession: (r) => r.protein.accession,
	centre_accession: (r) => r.centre.accession,
	centre: (r) => r.centre.label,
	cofactor_kind: (r) => r.centre.cofactorKind,
	oxidation_level: (r) => r.oxidationLevel,
	spin_s: (r) => r.spinS,
	g1: (r) => r.gValues[0],
	g2: (r) => r.gValues[1],
	g3: (r) => r.gValues[2],
	temperature_k: (r) => r.temperatureK,
	method: (r) => r.method,
	source_accession: (r) => r.source?.accession,
	demo_data: (r) => r.isDemo
});

export const DISTANCE_CSV = table<DistanceDto>({
	accession: (d) => d.accession,
	version: (d) => d.version,
	protein_accession: (d) => d.protein.accession,
	centre_a_accession: (d) => d.centreA.accession,
	centre_a: (d) => d.centreA.label,
	centre_b_accession: (d) => d.centreB.accession,
	centre_b: (d) => d.centreB.label,
	edge_to_edge_angstrom: (d) => d.edgeToEdgeAngstrom,
	centre_to_centre_angstrom: (d) => d.centreToCentreAngstrom,
	structure_id: (d) => d.structureId,
	method: (d) => d.method,
	source_accession: (d) => d.source?.accession,
	demo_data: (d) => d.isDemo
});
