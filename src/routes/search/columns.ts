import {
	columnVisibilityFeature,
	createColumnHelper,
	rowSortingFeature,
	tableFeatures
} from '@tanstack/svelte-table';
import { POTENTIAL_SORTS, type PotentialColumn } from '$lib/catalogue/searchTable';
import type { PageData } from './$types';

/*
 * The search table's features and columns. Sorting runs on the server (manual mode) and paging
 * follows the API's cursors; the page keeps both in the URL. The order puts the value right
 * after what it is the value of (centre and couple).
 */
export const features = tableFeatures({
	rowSortingFeature,
	columnVisibilityFeature
});

/** A row as the server shaped it for display (src/lib/server/catalogue/searchRows.ts). */
type Row = PageData['results']['rows'][number];

const helper = createColumnHelper<typeof features, Row>();
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

/* What each column holds (the text it shows; sorting runs on the server, so tanstack never compares these). */
const accessors: Record<PotentialColumn, (r: Row) => string | null> = {
	accession: (r) => r.accession,
	protein: (r) => r.protein.name,
	organism: (r) => r.protein.organism,
	centre: (r) => r.centre.label,
	kind: (r) => r.kind,
	couple: (r) => r.couple.text,
	em: (r) => r.em,
	reported: (r) => r.reported,
	ph: (r) => r.phValue,
	temperature: (r) => r.temperatureValue,
	method: (r) => r.method.short,
	source: (r) => r.source?.name ?? null
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
