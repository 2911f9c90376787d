import {
	formatAngstrom,
	formatGValues,
	formatKelvin,
	formatMv,
	formatNumber,
	formatPhValue,
	formatReportedValue,
	formatSpin,
	formatUncertaintyMv
} from '$lib/format';
import {
	REFERENCE_ELECTRODE_LABELS,
	type ReferenceElectrode
} from '$lib/science/referenceElectrodes';
import {
	COFACTOR_KIND_LABELS,
	METHOD_LABELS,
	type CofactorKind,
	type DistanceMethod,
	type PotentialMethod,
	type SpinMethod
} from '$lib/schemas/vocabulary';

type Method = PotentialMethod | SpinMethod | DistanceMethod;

/*
 * How the fields of entries' data are named and shown, with their units: the names several
 * kinds share. A kind may name a field of its own in its form fields (src/lib/kinds);
 * `fieldLabel` and `formatKindField` in src/lib/kinds look there first.
 */

export const FIELD_LABELS: Record<string, string> = {
	name: 'Name',
	organism: 'Organism',
	uniprot: 'UniProtKB',
	structureIds: 'Structures',
	description: 'Description',
	proteinAccession: 'Protein',
	label: 'Label',
	cofactorKind: 'Cofactor type',
	ligation: 'Ligation',
	chainId: 'Chain',
	residues: 'Residues',
	coordinatesA: 'Centroid (Å)',
	centreAccession: 'Centre',
	couple: 'Couple',
	emMvShe: 'Em vs SHE (converted)',
	reportedValue: 'Value as reported',
	reportedUnit: 'Unit as reported',
	referenceElectrode: 'Reference electrode',
	ph: 'pH',
	temperatureK: 'Temperature',
	ionicStrengthM: 'Ionic strength',
	buffer: 'Buffer',
	method: 'Method',
	nElectrons: 'n (electrons)',
	uncertaintyMv: 'Uncertainty',
	sourceAccession: 'Source',
	note: 'Note',
	oxidationLevel: 'Redox state',
	spinS: 'Spin S',
	gValues: 'g-values',
	centreAAccession: 'Centre A',
	centreBAccession: 'Centre B',
	edgeToEdgeA: 'Edge-to-edge distance',
	centreToCentreA: 'Centre-to-centre distance',
	structureId: 'Structure',
	sourceKind: 'Source type',
	doi: 'DOI',
	pubmedId: 'PubMed ID',
	title: 'Title',
	authors: 'Authors',
	journal: 'Journal',
	year: 'Year'
};

/**
 * A field's value as text with its unit (`unit` for a field this module does not know);
 * null/empty shows as an em dash.
 */
export function formatField(field: string, value: unknown, unit?: string): string {
	if (value === null || value === undefined || (Array.isArray(value) && value.length === 0))
		return '—';
	switch (field) {
		case 'emMvShe':
			return `${formatMv(value as number)} vs SHE`;
		case 'uncertaintyMv':
			return formatUncertaintyMv(value as number);
		case 'reportedValue':
			return formatReportedValue(value as number);
		case 'ph':
			return formatPhValue(value as number);
		case 'temperatureK':
			return formatKelvin(value as number);
		case 'ionicStrengthM':
			return `${formatNumber(value as number)}\u00a0M`;
		case 'edgeToEdgeA':
		case 'centreToCentreA':
			return formatAngstrom(value as number);
		case 'referenceElectrode':
			return REFERENCE_ELECTRODE_LABELS[value as ReferenceElectrode] ?? String(value);
		case 'cofactorKind':
			return COFACTOR_KIND_LABELS[value as CofactorKind] ?? String(value);
		case 'spinS':
			return formatSpin(value as number);
		case 'gValues':
			return formatGValues(value as number[]);
		case 'coordinatesA': {
			const c = value as { x: number; y: number; z: number };
			return `(${[c.x, c.y, c.z].map(formatNumber).join(', ')})`;
		}
		case 'method':
			return METHOD_LABELS[value as Method] ?? String(value);
	}
	const text = Array.isArray(value)
		? value.join(field === 'authors' ? '; ' : ', ')
		: typeof value === 'number'
			? formatNumber(value)
			: String(value);
	return unit ? `${text} ${unit}` : text;
}
