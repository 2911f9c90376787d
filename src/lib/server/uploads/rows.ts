import { isAccession } from '$lib/schemas/accession';
import type { UploadKind } from '$lib/kinds';
import { proteinSchema, type Protein } from '$lib/schemas/protein';
import type { VersionWarningKind } from '$lib/schemas/versionWarning';
import { centreLabelKey, type CentreFact, type UploadLookups } from './lookups';

// One row of a CSV upload as the kinds' upload rules (src/lib/server/kinds) see it, and the
// look-ups they share: proteins and centres named by accession or in words.

/** Reports a problem with one cell: the column (field name), the text, what is wrong. */
export type Report = (column: string, value: string, message: string) => void;

/**
 * Reports a warning on one cell: its kind (what queues count), the column (field name), the
 * text, what to look at, and where the range or rule comes from or which entry it concerns.
 */
export type Warn = (
	kind: VersionWarningKind,
	column: string,
	value: string,
	message: string,
	detail?: { source?: string; accession?: string }
) => void;

/** Stands in for the accession of a protein this file creates, until the commit assigns one. */
export const NEW_PROTEIN_PLACEHOLDER = 'HL000000';

export interface RowState {
	kind: UploadKind;
	lookups: UploadLookups;
	/** Proteins this file creates, by lower-case name and organism. */
	newProteins: Map<string, { key: string; row: number; data: Protein; planned: boolean }>;
	/** Keys of rows already read, for duplicates inside the file: key → row. */
	inFile: Map<string, number>;
}

export interface Resolved {
	centres: CentreFact[];
	newProtein: { key: string } | null;
	proteinEntryId: number | null;
}

/** One data row being checked. */
export interface UploadRow {
	state: RowState;
	/** Row as a spreadsheet numbers it: the header is row 1. */
	row: number;
	/** Values read from the cells, typed; the kind's rules may fill fields they resolve. */
	values: Record<string, unknown>;
	/** The cells' text, by column. */
	texts: Record<string, string>;
	/** An error: the row is not planned. */
	fail: Report;
	/** A warning: kept with the planned version. */
	warn: Warn;
}

/**
 * Records the row's key for duplicates within the file; false (after failing the row) when an
 * earlier row had the same key.
 */
export function firstInFile(r: UploadRow, key: string, column: string): boolean {
	const first = r.state.inFile.get(key);
	if (first !== undefined) {
		r.fail(column, r.texts[column] ?? '', `repeats row ${first}`);
		return false;
	}
	r.state.inFile.set(key, r.row);
	return true;
}

export function findProtein(
	state: RowState,
	text: string,
	report: Report,
	column: string
): { accession: string; entryId: number } | null {
	if (isAccession(text)) {
		const p = state.lookups.proteinsByAccession.get(text);
		if (!p) {
			report(column, text, `no protein ${text} in the registry (or not visible to you)`);
			return null;
		}
		return { accession: text, entryId: p.entryId };
	}
	const matches = state.lookups.proteinsByName.get(text.toLowerCase()) ?? [];
	if (matches.length === 1) return matches[0] ?? null;
	report(
		column,
		text,
		matches.length === 0
			? `no protein named "${text}" in the registry; use its accession`
			: `${matches.length} proteins are named "${text}" (${matches.map((m) => m.accession).join(', ')}); use the accession`
	);
	return null;
}

export function findCentre(
	state: RowState,
	values: Record<string, unknown>,
	texts: Record<string, string>,
	accessionField: string,
	labelField: string,
	report: Report
): CentreFact | null {
	const accession = texts[accessionField];
	if (accession) {
		const c = state.lookups.centresByAccession.get(accession);
		if (!c)
			report(
				accessionField,
				accession,
				`no centre ${accession} in the registry (or not visible to you)`
			);
		return c ?? null;
	}
	const proteinText = texts.protein;
	const label = texts[labelField];
	if (!proteinText || !label) {
		report(
			accessionField,
			'',
			`required: the centre's accession, or the protein and ${labelField}`
		);
		return null;
	}
	const protein = findProtein(state, proteinText, report, 'protein');
	if (!protein) return null;
	const c = state.lookups.centresByProteinLabel.get(centreLabelKey(protein.entryId, label));
	if (!c) report(labelField, label, `${protein.accession} has no centre labelled "${label}"`);
	else values[accessionField] = c.accession;
	return c ?? null;
}

export function resolveCentreProtein(
	state: RowState,
	values: Record<string, unknown>,
	texts: Record<string, string>,
	report: Report
): Resolved | null {
	if (texts.proteinAccession) {
		const p = findProtein(state, texts.proteinAccession, report, 'proteinAccession');
		return p ? { centres: [], newProtein: null, proteinEntryId: p.entryId } : null;
	}
	const name = texts.proteinName;
	if (!name) {
		report(
			'proteinAccession',
			'',
			"required: the protein's accession, or proteinName (with organism for a new protein)"
		);
		return null;
	}
	const organism = texts.organism ?? '';
	const key = `${name.toLowerCase()}|${organism.toLowerCase()}`;
	const earlier =
		state.newProteins.get(key) ??
		(organism
			? undefined
			: [...state.newProteins.values()].find(
					(p) => p.data.name.toLowerCase() === name.toLowerCase()
				));
	if (earlier) {
		values.proteinAccession = NEW_PROTEIN_PLACEHOLDER;
		return { centres: [], newProtein: { key: earlier.key }, proteinEntryId: null };
	}
	const approved = state.lookups.proteinsByName.get(name.toLowerCase()) ?? [];
	if (approved.length === 1 && !organism) {
		values.proteinAccession = approved[0]?.accession;
		return { centres: [], newProtein: null, proteinEntryId: approved[0]?.entryId ?? null };
	}
	if (!organism) {
		report(
			'organism',
			'',
			approved.length > 1
				? `several proteins are named "${name}"; give the accession`
				: `"${name}" is not in the registry: give its organism to create it`
		);
		return null;
	}
	const protein = proteinSchema.safeParse({
		name,
		organism,
		uniprot: texts.uniprot || null,
		structureIds: (texts.structureIds ?? '').split(/[,;\s|]+/).filter(Boolean),
		description: null
	});
	if (!protein.success) {
		for (const i of protein.error.issues) {
			const field = i.path[0] === 'name' ? 'proteinName' : String(i.path[0]);
			report(field, texts[field] ?? '', i.message);
		}
		return null;
	}
	state.newProteins.set(key, { key, row: 0, data: protein.data, planned: false });
	values.proteinAccession = NEW_PROTEIN_PLACEHOLDER;
	return { centres: [], newProtein: { key }, proteinEntryId: null };
}

/**
 * A row identified by `key` (what makes two entries of its kind the same): an error when an
 * earlier row of the file had the key, a warning naming the approved entry that has it.
 * False when the row has an error.
 */
export function checkDuplicateKey(
	r: UploadRow,
	key: string,
	approved: ReadonlyMap<string, string>,
	columns: { inFile: string; warn: string; value: string }
): boolean {
	if (!firstInFile(r, key, columns.inFile)) return false;
	const accession = approved.get(key);
	if (accession)
		r.warn('duplicate', columns.warn, columns.value, `already in the registry as ${accession}`, {
			accession
		});
	return true;
}
