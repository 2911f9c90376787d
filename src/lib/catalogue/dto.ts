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
	edgeToEdgeA: number;
	centreToCentreA: number | null;
	structureId: string;
	method: string;
	source: SourceRef | null;
	isDemo: boolean;
}

export interface Page<T> {
	items: T[];
	total: number;
	nextCursor: string | null;
}

export interface VersionSummary {
	version: number;
	approvedAt: string;
	changeNote: string | null;
}

/**
 * An entry a version names, pinned to the version of it that was approved when the naming
 * version was (entry_version_reference, migration 0009).
 */
export interface PinnedReference {
	accession: string;
	kind: EntryKind;
	/** The referenced entry's version this version was approved against. */
	version: number;
	/** The title of that version, from its data and its own pinned references. */
	title: string;
}

/**
 * One approved version as it was approved: none of this changes after approval, whatever is
 * approved later (a reference the reader may not see is left out: its field reads null).
 */
export interface FrozenVersion {
	accession: string;
	kind: EntryKind;
	isDemo: boolean;
	version: number;
	approvedAt: string;
	changeNote: string | null;
	data: Record<string, unknown>;
	/** The entries this version names, by field, at their pinned versions. */
	references: Record<string, PinnedReference>;
	/** From the version's own data and its pinned references, never from later versions. */
	title: string;
}

/** What is true of an entry now rather than of one version: it changes with later approvals. */
export interface EntryLiveState {
	latestVersion: number;
	/** The newest approved versions (at most VERSIONS_LISTED), oldest first. */
	versions: VersionSummary[];
	visibility: Visibility;
	/**
	 * For references whose entry has a newer approved version than the pinned one: that
	 * entry's latest version, by field.
	 */
	newerReferences: Record<string, number>;
}

/** One entry at one version, as the permalink page shows it: the frozen version, and now. */
export interface EntryView extends FrozenVersion {
	live: EntryLiveState;
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
