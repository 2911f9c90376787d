import Papa from 'papaparse';
import { ENTRY_FORM_FIELDS, type FormField } from './entryForm';

/*
 * The columns of each CSV upload, built from the entry forms' fields (and so from the zod
 * schemas behind them) plus the columns that name proteins and centres in words instead of
 * accessions. Shared by the templates, the column reference page, the browser preview and the
 * server's reader.
 */
export const UPLOAD_KINDS = ['potential', 'spin_record', 'distance', 'centre'] as const;
export type UploadKind = (typeof UPLOAD_KINDS)[number];

export const UPLOAD_KIND_LABELS: Record<UploadKind, string> = {
	potential: 'Potentials',
	spin_record: 'Spin records',
	distance: 'Distances',
	centre: 'Centres and proteins'
};

/** What one row of each kind of file is, in the plural, for titles and counts. */
export const UPLOAD_KIND_NOUNS: Record<UploadKind, string> = {
	potential: 'potentials',
	spin_record: 'spin records',
	distance: 'distances',
	centre: 'centres'
};

export interface UploadColumn extends FormField {
	/** Other header spellings accepted (compared without case, spaces, units or punctuation). */
	aliases: readonly string[];
	/** A value for the template's example row (invented). */
	example: string;
	/** Required unless its alternative column(s) are given. */
	alternative?: string;
}

const by = (
	name: string,
	label: string,
	hint: string,
	example: string,
	alternative?: string
): UploadColumn => ({
	name,
	label,
	type: 'text',
	hint,
	aliases: [],
	example,
	alternative
});

const ALIASES: Record<string, readonly string[]> = {
	reportedValue: ['value', 'em', 'potential', 'midpoint potential', 'reported value'],
	reportedUnit: ['unit'],
	referenceElectrode: ['reference', 'electrode', 'reference electrode', 'vs'],
	temperatureK: ['temperature', 't'],
	ionicStrengthM: ['ionic strength'],
	uncertaintyMv: ['uncertainty', 'error', 'sd'],
	nElectrons: ['n'],
	sourceAccession: ['source'],
	centreAccession: ['centre accession', 'center accession'],
	centreAAccession: ['centre a accession'],
	centreBAccession: ['centre b accession'],
	proteinAccession: ['protein accession'],
	cofactorKind: ['kind', 'cofactor', 'cofactor kind'],
	oxidationLevel: ['oxidation level', 'level'],
	spinS: ['spin', 's'],
	gValues: ['g', 'g values', 'g-values'],
	edgeToEdgeA: ['edge to edge', 'edge-to-edge', 'edge'],
	centreToCentreA: ['centre to centre', 'centre-to-centre', 'center to center'],
	structureId: ['structure', 'pdb'],
	coordinatesA: ['coordinates', 'centroid']
};

const EXAMPLES: Record<string, string> = {
	centreAccession: 'HL000012',
	couple: '[4Fe-4S]2+/1+',
	reportedValue: '-0.512',
	reportedUnit: 'V',
	referenceElectrode: 'AgAgCl_sat',
	ph: '7.5',
	temperatureK: '25 °C',
	ionicStrengthM: '0.1',
	buffer: 'HEPES 50 mM',
	method: 'epr_titration',
	nElectrons: '1',
	uncertaintyMv: '15',
	sourceAccession: '',
	note: 'invented example row',
	oxidationLevel: '[4Fe-4S]1+',
	spinS: '0.5',
	gValues: '2.05 1.94 1.89',
	centreAAccession: 'HL000011',
	centreBAccession: 'HL000012',
	edgeToEdgeA: '11.2',
	centreToCentreA: '14.0',
	structureId: 'DEMO1',
	proteinAccession: '',
	label: 'N7',
	cofactorKind: 'fe4s4',
	ligation: 'Cys4',
	chainId: 'B',
	residues: '45 48 51 83',
	coordinatesA: '10.1 -4.2 33.0'
};

/** Where a kind's example differs from the shared one. */
const KIND_EXAMPLES: Partial<Record<UploadKind, Record<string, string>>> = {
	spin_record: { method: 'cw_epr_x', temperatureK: '10', note: 'invented example row' },
	distance: { method: 'crystal_structure' }
};

function fromForm(kind: UploadKind): UploadColumn[] {
	return ENTRY_FORM_FIELDS[kind].map((f) => ({
		...f,
		aliases: ALIASES[f.name] ?? [],
		example: KIND_EXAMPLES[kind]?.[f.name] ?? EXAMPLES[f.name] ?? ''
	}));
}

function withAlternative(
	columns: UploadColumn[],
	name: string,
	alternative: string
): UploadColumn[] {
	return columns.map((c) => (c.name === name ? { ...c, required: false, alternative } : c));
}

const CENTRE_BY_NAME = [
	by(
		'protein',
		'Protein (name or accession)',
		'with centreLabel, instead of the centre accession',
		''
	),
	by('centreLabel', 'Centre label', "the centre's label within that protein, e.g. N2", '')
];

export const UPLOAD_COLUMNS: Record<UploadKind, readonly UploadColumn[]> = {
	potential: [
		// The unit and the electrode may instead ride in the value's header or cell: "(mV vs SCE)".
		...withAlternative(
			withAlternative(
				withAlternative(fromForm('potential'), 'centreAccession', 'protein + centreLabel'),
				'reportedUnit',
				'a unit in the reportedValue header or cell'
			),
			'referenceElectrode',
			'"vs …" in the reportedValue header or cell'
		),
		...CENTRE_BY_NAME
	],
	spin_record: [
		...withAlternative(fromForm('spin_record'), 'centreAccession', 'protein + centreLabel'),
		...CENTRE_BY_NAME
	],
	distance: [
		...withAlternative(
			withAlternative(fromForm('distance'), 'centreAAccession', 'protein + centreALabel'),
			'centreBAccession',
			'protein + centreBLabel'
		),
		by('protein', 'Protein (name or accession)', 'with centreALabel and centreBLabel', ''),
		by('centreALabel', 'Centre A label', 'label of centre A within that protein', ''),
		by('centreBLabel', 'Centre B label', 'label of centre B within that protein', '')
	],
	centre: [
		...withAlternative(fromForm('centre'), 'proteinAccession', 'proteinName + organism'),
		by(
			'proteinName',
			'Protein name',
			'an approved protein, one made by an earlier row, or a new one (give organism)',
			'Demo hydrogenase-like complex'
		),
		by('organism', 'Organism', 'for a new protein', 'Calorivorax demonstrans HL-1 (fictional)'),
		by('uniprot', 'UniProtKB', 'for a new protein, optional', ''),
		by('structureIds', 'Structures', 'for a new protein, optional', 'DEMO1')
	]
};

/** A header as people write it, reduced for matching: no case, units, spaces or punctuation. */
export function headerKey(header: string): string {
	return header
		.replace(/[([{].*?[)\]}]/g, '')
		.replace(/\/\s*(mV|V|K|°C|Å|M)\s*$/i, '')
		.toLowerCase()
		.replace(/[^a-z0-9]/g, '');
}

/** The column a header names, or null. */
export function columnForHeader(kind: UploadKind, header: string): UploadColumn | null {
	const key = headerKey(header);
	if (!key) return null;
	for (const c of UPLOAD_COLUMNS[kind]) {
		if (headerKey(c.name) === key || headerKey(c.label) === key) return c;
		if (c.aliases.some((a) => headerKey(a) === key)) return c;
	}
	return null;
}

/** The template: the header row and one invented example row. */
export function templateCsv(kind: UploadKind): string {
	const columns = UPLOAD_COLUMNS[kind];
	return Papa.unparse(
		{ fields: columns.map((c) => c.name), data: [columns.map((c) => c.example)] },
		{ newline: '\r\n' }
	);
}
