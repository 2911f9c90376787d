import type { CatalogueFacets, FacetCount, Page, PotentialDto } from '$lib/catalogue/dto';
import {
	formatKelvin,
	formatKelvinValue,
	formatMv,
	formatPh,
	formatPhValue,
	formatReported,
	typesetCharges
} from '$lib/format';
import type { PotentialPageQuery } from '$lib/schemas/catalogueQuery';
import {
	COFACTOR_KIND_LABELS,
	POTENTIAL_METHOD_LABELS,
	type PotentialMethod
} from '$lib/schemas/vocabulary';
import { REFERENCE_ELECTRODE_LABELS } from '$lib/science/referenceElectrodes';

/*
 * The search page's rows and facets as it shows them: every number formatted, every identifier
 * labelled, here on the server. The page's browser code then needs neither the number formats
 * nor the vocabularies (nor the reference electrodes' conversions that sit beside their labels);
 * it lays out text. The rows are still the read API's rows, one for one.
 */

/** One potential as a row and a phone card of the search page show it. */
export interface SearchRow {
	accession: string;
	isDemo: boolean;
	protein: { accession: string; name: string; organism: string };
	centre: { accession: string; label: string };
	/** The cofactor kind's label. */
	kind: string;
	/** The couple as typed (the tooltip) and with its charges typeset (the text). */
	couple: { text: string; typeset: string };
	/** Em vs SHE, converted: "−412 mV". */
	em: string;
	/** "10 mV", or null when none was reported. */
	uncertainty: string | null;
	/** The value as reported, with its unit and electrode: "−0.65 V vs Ag/AgCl (3 M KCl)". */
	reported: string;
	/** "pH 7.0" (a card) and "7.0" (the table's pH column); "—" when unknown. */
	ph: string;
	phValue: string;
	/** "298.15 K" (a card) and "298.15" (the table's T column); "—" when unknown. */
	temperature: string;
	temperatureValue: string;
	/** The method as the table names it, and its full name (the tooltip). */
	method: { short: string; name: string };
	/** The source as "Author 2019", or null when none is named (or the reader may not see it). */
	source: { accession: string; name: string } | null;
}

/** Methods as the table names them (the full name is the cell's tooltip). */
const METHOD_SHORT: Record<PotentialMethod, string> = {
	epr_titration: 'EPR titration',
	optical_titration: 'optical titration',
	protein_film_voltammetry: 'PFV',
	solution_voltammetry: 'solution voltammetry',
	spectroelectrochemistry: 'SEC',
	mcd_titration: 'MCD titration',
	computed: 'computed'
};

export function searchRow(p: PotentialDto): SearchRow {
	const electrode =
		REFERENCE_ELECTRODE_LABELS[p.reported.referenceElectrode] ?? p.reported.referenceElectrode;
	return {
		accession: p.accession,
		isDemo: p.isDemo,
		protein: { accession: p.protein.accession, name: p.protein.name, organism: p.protein.organism },
		centre: { accession: p.centre.accession, label: p.centre.label },
		kind: COFACTOR_KIND_LABELS[p.centre.cofactorKind],
		couple: { text: p.couple, typeset: typesetCharges(p.couple) },
		em: formatMv(p.emMvShe),
		uncertainty: p.uncertaintyMv === null ? null : formatMv(p.uncertaintyMv),
		reported: formatReported(p.reported.value, p.reported.unit, electrode),
		ph: formatPh(p.ph),
		phValue: p.ph === null ? '—' : formatPhValue(p.ph),
		temperature: formatKelvin(p.temperatureK),
		temperatureValue: p.temperatureK === null ? '—' : formatKelvinValue(p.temperatureK),
		method: {
			short: METHOD_SHORT[p.method] ?? p.method,
			name: POTENTIAL_METHOD_LABELS[p.method] ?? p.method
		},
		source: p.source
			? {
					accession: p.source.accession,
					name: `${p.source.firstAuthor?.split(',')[0] ?? p.source.accession}${p.source.year ? ` ${p.source.year}` : ''}`
				}
			: null
	};
}

/** A page of the API's potentials as the search page shows it. */
export function searchRows(page: Page<PotentialDto>) {
	return {
		total: page.total,
		offset: page.offset,
		nextCursor: page.nextCursor,
		prevCursor: page.prevCursor,
		rows: page.items.map(searchRow)
	};
}

/** One choice of a facet: its value (the URL's), its label and how many potentials it gives. */
export interface FacetChoice {
	value: string;
	label: string;
	count: number;
}

/*
 * Counts are within the current search (each facet without its own filter: what ticking the
 * choice would give). Choices with no match are left out, except chosen ones, which stay
 * visible (count 0, dimmed by the page), so that they can be unticked. Only values with a count
 * come from the API, so nothing hidden from the reader is ever named here.
 */
function choices(
	counts: FacetCount[],
	selected: readonly string[] | undefined,
	labels: Record<string, string>
): FacetChoice[] {
	const chosenWithoutMatch = (selected ?? [])
		.filter((v) => !counts.some((c) => c.value === v))
		.map((value) => ({ value, count: 0 }));
	return [...counts, ...chosenWithoutMatch].map((c) => ({
		value: c.value,
		label: labels[c.value] ?? c.value,
		count: c.count
	}));
}

/** The facets of a search page, each with its chosen values. */
export function searchFacets(facets: CatalogueFacets, query: PotentialPageQuery) {
	return {
		kinds: choices(facets.kinds, query.kind, COFACTOR_KIND_LABELS),
		organisms: choices(facets.organisms, query.organism, {}),
		methods: choices(facets.methods, query.method, POTENTIAL_METHOD_LABELS)
	};
}
