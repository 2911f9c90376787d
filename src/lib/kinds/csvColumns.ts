import type { HeaderNames } from '$lib/catalogue/headerMatch';
import { ACCESSION_HINT, type FormField } from './formFields';
import { publicFieldName } from './publicNames';

// The columns of a CSV upload are the kind's form fields (and so its schema's) plus columns
// that name proteins and centres in words instead of accessions. Each uploadable kind lists its
// columns with these helpers; header spellings and example values are shared across kinds.

/**
 * One column of an upload: a form field, or a column that finds an entry in words. `name` is the
 * field it fills (the stored name); `header` is what templates and the column reference call it
 * (the public name, publicNames.ts); both, the label and the aliases are accepted in a file.
 */
export interface UploadColumn extends FormField, HeaderNames {
	header: string;
	/** A value for the template's example row (invented). */
	example: string;
	/** Required unless its alternative column(s) are given. */
	alternative?: string;
}

/** A column that only finds an entry in words, or describes one to create: no field of the data. */
export const by = (
	name: string,
	label: string,
	hint: string,
	example: string,
	alternative?: string
): UploadColumn => ({
	name,
	header: name,
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

/**
 * The note of every template's example row. The row's values are invented (its accessions may
 * name real entries of a registry), so a check refuses a row that still carries this note
 * (`isTemplateExampleRow`): the example can never be committed as data by mistake.
 */
export const EXAMPLE_ROW_NOTE =
	'EXAMPLE ROW (invented values): replace or delete this row before uploading';

/** The error a row still carrying the template's example note gets. */
export const EXAMPLE_ROW_MESSAGE =
	"this is the template's example row, with invented values, not data: delete it or replace it with your own values";

/** Whether a note cell is the template's example-row note (spacing and case aside). */
export function isTemplateExampleRow(note: string | undefined): boolean {
	const squash = (t: string) => t.replace(/\s+/g, ' ').trim().toLowerCase();
	return note !== undefined && squash(note) === squash(EXAMPLE_ROW_NOTE);
}

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
	note: EXAMPLE_ROW_NOTE,
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

/** The kind's form fields as columns, with the shared aliases and examples. */
export function columnsFromFields(
	fields: readonly FormField[],
	examples: Record<string, string> = {}
): UploadColumn[] {
	return fields.map((f) => {
		const header = publicFieldName(f.name);
		const aliases = ALIASES[f.name] ?? [];
		return {
			...f,
			// A file names other entries by accession (or in words, by the columns below).
			...(f.lookup ? { hint: ACCESSION_HINT } : {}),
			header,
			// A renamed field's stored name stays accepted (files written before the rename).
			aliases: header === f.name ? aliases : [...aliases, f.name],
			example: examples[f.name] ?? EXAMPLES[f.name] ?? ''
		};
	});
}

/** Makes a required column optional when another column (or a unit in a header) can stand in. */
export function withAlternative(
	columns: UploadColumn[],
	name: string,
	alternative: string
): UploadColumn[] {
	return columns.map((c) => (c.name === name ? { ...c, required: false, alternative } : c));
}

/** A centre named by its protein and label instead of its accession. */
export const CENTRE_BY_NAME = [
	by(
		'protein',
		'Protein (name or accession)',
		'with centreLabel, instead of the centre accession',
		''
	),
	by('centreLabel', 'Centre label', "the centre's label within that protein, e.g. N2", '')
];
