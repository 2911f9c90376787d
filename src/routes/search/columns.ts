import {
	columnVisibilityFeature,
	createColumnHelper,
	rowSortingFeature,
	tableFeatures
} from '@tanstack/svelte-table';
import type { PotentialDto } from '$lib/catalogue/dto';
import { POTENTIAL_SORTS, type PotentialColumn } from '$lib/schemas/catalogueQuery';

/*
 * The search table's features and columns. Sorting runs on the server (manual mode) and paging
 * follows the API's cursors; the page keeps both in the URL.
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
	organism: 'Organism',
	centre: 'Centre',
	kind: 'Cofactor kind',
	couple: 'Couple',
	em: 'Em (mV vs SHE)',
	reported: 'As reported',
	ph: 'pH',
	temperature: 'T (K)',
	method: 'Method',
	source: 'Source'
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
