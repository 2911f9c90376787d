import {
	columnVisibilityFeature,
	createColumnHelper,
	rowSortingFeature,
	tableFeatures
} from '@tanstack/svelte-table';
import type { PotentialDto } from '$lib/catalogue/dto';
import { POTENTIAL_SORTS, type PotentialColumn } from '$lib/catalogue/searchTable';
import type { PotentialMethod } from '$lib/schemas/vocabulary';

/*
 * The search table's features and columns. Sorting runs on the server (manual mode) and paging
 * follows the API's cursors; the page keeps both in the URL. The order puts the value right
 * after what it is the value of (centre and couple).
 */
export const features = tableFeatures({
	rowSortingFeature,
	columnVisibilityFeature
});

const helper = createColumnHelper<typeof features, PotentialDto>();
const sortable = (id: PotentialColumn) => (POTENTIAL_SORTS as readonly string[]).includes(id);

export const COLUMN_LABELS: Record<PotentialColumn, string> = {
	accession: 'Accession',
	protein: 'Protein',
	centre: 'Centre',
	couple: 'Couple',
	em: 'Em vs SHE (converted)',
	kind: 'Cofactor type',
	ph: 'pH',
	temperature: 'T (K)',
	method: 'Method',
	source: 'Source',
	reported: 'As reported',
	organism: 'Organism'
};

/** Methods as the table names them (the full name is the cell's tooltip). */
export const METHOD_SHORT: Record<PotentialMethod, string> = {
	epr_titration: 'EPR titration',
	optical_titration: 'optical titration',
	protein_film_voltammetry: 'PFV',
	solution_voltammetry: 'solution voltammetry',
	spectroelectrochemistry: 'SEC',
	mcd_titration: 'MCD titration',
	computed: 'computed'
};

const accessors: Record<PotentialColumn, (p: PotentialDto) => string | number | null> = {
	accession: (p) => p.accession,
	protein: (p) => p.protein.name,
	organism: (p) => p.protein.organism,
	centre: (p) => p.centre.label,
	kind: (p) => p.centre.cofactorKind,
	couple: (p) => p.couple,
	em: (p) => p.emMvShe,
	reported: (p) => p.reported.value,
	ph: (p) => p.ph,
	temperature: (p) => p.temperatureK,
	method: (p) => p.method,
	source: (p) => p.source?.accession ?? null
};

export const columns = helper.columns(
	(Object.keys(COLUMN_LABELS) as PotentialColumn[]).map((id) =>
		helper.accessor(accessors[id], {
			id,
			header: COLUMN_LABELS[id],
			enableSorting: sortable(id),
			// A first click always sorts ascending (most negative Em first), whatever the column holds.
			sortDescFirst: false
		})
	)
);
