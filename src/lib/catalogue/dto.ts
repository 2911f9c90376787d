/*
 * The shapes the catalogue hands to pages and API clients (camelCase, units in the names).
 * Built from database rows by one mapper per entity in src/lib/server/catalogue/mappers.ts.
 */
import type { CofactorKind, Visibility } from '$lib/schemas/vocabulary';
import type { EntryKind } from '$lib/kinds';

export interface EntryRef {
	accession: string;
}

export interface ProteinRef extends EntryRef {
	name: string;
	organism: string;
}

export interface CentreRef extends EntryRef {
	label: string;
	cofactorKind: CofactorKind;
}

export interface SourceRef extends EntryRef {
	doi: string | null;
	year: number | null;
	firstAuthor: string | null;
}

export interface ProteinDto extends ProteinRef {
	version: number;
	uniprot: string | null;
	structureIds: string[];
	centreCount: number;
	isDemo: boolean;
}

export interface CentreDto extends CentreRef {
	version: number;
	protein: ProteinRef;
	ligation: string | null;
	chainId: string | null;
	residues: number[];
	isDemo: boolean;
}

export interface PotentialDto {
	accession: string;
	version: number;
	centre: CentreRef;
	protein: ProteinRef;
	couple: string;
	emMvShe: number;
	reported: { value: number; unit: string; referenceElectrode: string };
	ph: number | null;
	temperatureK: number | null;
	ionicStrengthM: number | null;
	buffer: string | null;
	method: string;
	nElectrons: number;
	uncertaintyMv: number | null;
	source: SourceRef | null;
	isDemo: boolean;
}

export interface SpinRecordDto {
	accession: string;
	version: number;
	centre: CentreRef;
	protein: ProteinRef;
	oxidationLevel: string;
	spinS: number;
	gValues: number[];
	temperatureK: number | null;
	method: string;
	source: SourceRef | null;
	isDemo: boolean;
}

export interface DistanceDto {
	accession: string;
	version: number;
	centreA: CentreRef;
	centreB: CentreRef;
	protein: ProteinRef;
	/** Å; the stored version's field is `edgeToEdgeA` (see DEVELOPERS.md, "Public names"). */
	edgeToEdgeAngstrom: number;
	centreToCentreAngstrom: number | null;
	structureId: string;
	method: string;
	source: SourceRef | null;
	isDemo: boolean;
}

/**
 * One page of a list. `offset` is the position of its first row among all `total` matches as
 * the list stood when the page was read; the cursors lead to the rows right after and right
 * before it (null at either end).
 */
export interface Page<T> {
	items: T[];
	total: number;
	offset: number;
	nextCursor: string | null;
	prevCursor: string | null;
}

export interface VersionSummary {
	version: number;
	approvedAt: string;
	changeNote: string | null;
}

/** One entry at one version, as the permalink page and the API show it. */
export interface EntryView {
	accession: string;
	kind: EntryKind;
	visibility: Visibility;
	isDemo: boolean;
	version: number;
	latestVersion: number;
	approvedAt: string;
	changeNote: string | null;
	data: Record<string, unknown>;
	versions: VersionSummary[];
	/** Names of the entries this version refers to, so pages can show links with labels. */
	references: Record<string, { accession: string; kind: EntryKind; title: string }>;
	title: string;
}

export interface FacetCount {
	value: string;
	count: number;
}

export interface CatalogueFacets {
	kinds: FacetCount[];
	organisms: FacetCount[];
	methods: FacetCount[];
	totals: { proteins: number; centres: number; potentials: number };
}
