/*
 * Controlled vocabularies of the registry: the one list of each, used by forms, CSV rows, the API,
 * facets and labels. Identifiers are stable (they appear in URLs and API payloads); labels are
 * what people read.
 */

export const COFACTOR_KINDS = [
	'fe2s2_ferredoxin',
	'fe2s2_rieske',
	'fe3s4',
	'fe4s4',
	'fe4s4_hipip',
	'heme_a',
	'heme_b',
	'heme_c',
	'fmn',
	'fad',
	'ubiquinone',
	'menaquinone',
	'plastoquinone',
	'cu_type1',
	'cu_a',
	'mo_w_pterin',
	'nife',
	'fefe',
	'other'
] as const;
export type CofactorKind = (typeof COFACTOR_KINDS)[number];

export const COFACTOR_KIND_LABELS: Record<CofactorKind, string> = {
	fe2s2_ferredoxin: '[2Fe-2S] ferredoxin-type',
	fe2s2_rieske: '[2Fe-2S] Rieske-type',
	fe3s4: '[3Fe-4S]',
	fe4s4: '[4Fe-4S]',
	fe4s4_hipip: '[4Fe-4S] HiPIP-type',
	heme_a: 'heme a',
	heme_b: 'heme b',
	heme_c: 'heme c',
	fmn: 'FMN',
	fad: 'FAD',
	ubiquinone: 'ubiquinone',
	menaquinone: 'menaquinone',
	plastoquinone: 'plastoquinone',
	cu_type1: 'type-1 Cu',
	cu_a: 'CuA',
	mo_w_pterin: 'Mo/W-pterin',
	nife: '[NiFe]',
	fefe: '[FeFe]',
	other: 'other'
};

/** Families group cofactor kinds for browsing. */
export const COFACTOR_FAMILIES: { label: string; kinds: CofactorKind[] }[] = [
	{
		label: 'Iron–sulfur clusters',
		kinds: ['fe2s2_ferredoxin', 'fe2s2_rieske', 'fe3s4', 'fe4s4', 'fe4s4_hipip']
	},
	{ label: 'Hemes', kinds: ['heme_a', 'heme_b', 'heme_c'] },
	{ label: 'Flavins', kinds: ['fmn', 'fad'] },
	{ label: 'Quinones', kinds: ['ubiquinone', 'menaquinone', 'plastoquinone'] },
	{ label: 'Copper sites', kinds: ['cu_type1', 'cu_a'] },
	{ label: 'Other metal sites', kinds: ['mo_w_pterin', 'nife', 'fefe', 'other'] }
];

/**
 * The couples a potential may refer to, per cofactor kind (oxidised/reduced level). 'other'
 * accepts any couple written in the same form.
 */
export const COUPLES_BY_KIND: Record<CofactorKind, readonly string[]> = {
	fe2s2_ferredoxin: ['[2Fe-2S]2+/1+'],
	fe2s2_rieske: ['[2Fe-2S]2+/1+'],
	fe3s4: ['[3Fe-4S]1+/0', '[3Fe-4S]0/2-'],
	fe4s4: ['[4Fe-4S]2+/1+', '[4Fe-4S]1+/0'],
	fe4s4_hipip: ['[4Fe-4S]3+/2+'],
	heme_a: ['Fe3+/Fe2+'],
	heme_b: ['Fe3+/Fe2+'],
	heme_c: ['Fe3+/Fe2+'],
	fmn: ['ox/sq', 'sq/hq', 'ox/hq'],
	fad: ['ox/sq', 'sq/hq', 'ox/hq'],
	ubiquinone: ['Q/SQ', 'SQ/QH2', 'Q/QH2'],
	menaquinone: ['Q/SQ', 'SQ/QH2', 'Q/QH2'],
	plastoquinone: ['Q/SQ', 'SQ/QH2', 'Q/QH2'],
	cu_type1: ['Cu2+/Cu+'],
	cu_a: ['CuA ox/red'],
	mo_w_pterin: ['Mo(VI)/Mo(V)', 'Mo(V)/Mo(IV)', 'W(VI)/W(V)', 'W(V)/W(IV)'],
	nife: ['Ni-SI/Ni-C', 'Ni-C/Ni-R'],
	fefe: ['Hox/Hred'],
	other: []
};

export const POTENTIAL_METHODS = [
	'epr_titration',
	'optical_titration',
	'protein_film_voltammetry',
	'solution_voltammetry',
	'spectroelectrochemistry',
	'mcd_titration',
	'computed'
] as const;
export type PotentialMethod = (typeof POTENTIAL_METHODS)[number];

export const POTENTIAL_METHOD_LABELS: Record<PotentialMethod, string> = {
	epr_titration: 'EPR-monitored redox titration',
	optical_titration: 'optically monitored redox titration',
	protein_film_voltammetry: 'protein film voltammetry',
	solution_voltammetry: 'solution voltammetry',
	spectroelectrochemistry: 'spectroelectrochemistry',
	mcd_titration: 'MCD-monitored redox titration',
	computed: 'computed estimate (not a measurement)'
};

export const SPIN_METHODS = [
	'cw_epr_x',
	'cw_epr_q',
	'pulsed_epr',
	'mossbauer',
	'mcd',
	'magnetic_susceptibility',
	'computed'
] as const;
export type SpinMethod = (typeof SPIN_METHODS)[number];

export const SPIN_METHOD_LABELS: Record<SpinMethod, string> = {
	cw_epr_x: 'CW EPR, X-band',
	cw_epr_q: 'CW EPR, Q-band',
	pulsed_epr: 'pulsed EPR',
	mossbauer: 'Mössbauer',
	mcd: 'MCD',
	magnetic_susceptibility: 'magnetic susceptibility',
	computed: 'computed estimate (not a measurement)'
};

export const DISTANCE_METHODS = [
	'crystal_structure',
	'cryo_em_structure',
	'nmr_structure',
	'structural_model'
] as const;
export type DistanceMethod = (typeof DISTANCE_METHODS)[number];

export const DISTANCE_METHOD_LABELS: Record<DistanceMethod, string> = {
	crystal_structure: 'crystal structure',
	cryo_em_structure: 'cryo-EM structure',
	nmr_structure: 'NMR structure',
	structural_model: 'structural model (not an experimental structure)'
};

/** Every method's label: an identifier two vocabularies share ('computed') has one label (tested). */
export const METHOD_LABELS: Record<PotentialMethod | SpinMethod | DistanceMethod, string> = {
	...POTENTIAL_METHOD_LABELS,
	...SPIN_METHOD_LABELS,
	...DISTANCE_METHOD_LABELS
};

export const SOURCE_KINDS = ['publication', 'dataset'] as const;
export type SourceKind = (typeof SOURCE_KINDS)[number];

export const VISIBILITIES = ['public', 'group', 'embargoed'] as const;
export type Visibility = (typeof VISIBILITIES)[number];
