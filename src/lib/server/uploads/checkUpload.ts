import { createHash } from 'node:crypto';
import { setImmediate } from 'node:timers/promises';
import type { Kysely } from 'kysely';
import { potentialConflict } from '$lib/catalogue/conflicts';
import type { CsvLimits } from '$lib/catalogue/csvRecords';
import { checkTypicalRange } from '$lib/catalogue/typicalRanges';
import { UPLOAD_COLUMNS, columnForHeader, type UploadKind } from '$lib/catalogue/uploadColumns';
import { isAccession } from '$lib/schemas/accession';
import type { EntryData } from '$lib/schemas/entryData';
import { proteinSchema, type Protein } from '$lib/schemas/protein';
import { parseEntryInput } from '$lib/schemas/submission';
import { COUPLES_BY_KIND } from '$lib/schemas/vocabulary';
import type { Database } from '../db/schema';
import type { Viewer } from '../catalogue/visibility';
import { headerUnit, matchOption, readCell } from './cells';
import {
	centreLabelKey,
	distanceKey,
	loadUploadLookups,
	spinKey,
	type CentreFact,
	type UploadLookups
} from './lookups';
import { readCsv } from './readCsv';

/*
 * Checks a CSV upload row by row against the zod schemas and the registry, and plans what a
 * commit would create. Nothing is written here: the dry run and the commit both start from it.
 */
export interface UploadIssue {
	/** Row as a spreadsheet numbers it: the header is row 1. */
	row: number;
	column: string;
	value: string;
	message: string;
	severity: 'error' | 'warning';
}

export interface PlannedEntry {
	row: number;
	entry: EntryData;
	warnings: string[];
	/** A centre whose protein is created by this file: the protein's key in `proteins`. */
	newProteinKey: string | null;
}

export interface PlannedProtein {
	key: string;
	row: number;
	data: Protein;
}

export interface UploadCheck {
	kind: UploadKind;
	sha256: string;
	byteSize: number;
	delimiter: string;
	rowCount: number;
	columns: { header: string; column: string | null }[];
	issues: UploadIssue[];
	errorCount: number;
	warningCount: number;
	entries: PlannedEntry[];
	proteins: PlannedProtein[];
	previousUpload: { submissionId: number; status: string; createdAt: string } | null;
}

/** Where a required value may come from besides its own column. */
const REQUIRED_HINTS: Record<string, string> = {
	reportedUnit:
		'required: a reportedUnit column, a unit in the header such as "reportedValue (mV)", or one in the cell',
	referenceElectrode:
		'required: a referenceElectrode column, or "vs SCE" (etc.) in the reportedValue header or cell'
};

/** Stands in for the accession of a protein this file creates, until the commit assigns one. */
const NEW_PROTEIN_PLACEHOLDER = 'HL000000';
const YIELD_EVERY = 500;

export async function checkUpload(
	db: Kysely<Database>,
	text: string,
	kind: UploadKind,
	options: {
		viewer: Viewer | null;
		limits: CsvLimits;
		/** The uploader: only their own earlier uploads of the same file are recognised. */
		uploaderId?: string | null;
	}
): Promise<UploadCheck> {
	const sha256 = createHash('sha256').update(text).digest('hex');
	const table = await readCsv(text, options.limits);
	const lookups = await loadUploadLookups(db, options.viewer);
	const issues: UploadIssue[] = table.problems.map((p) => ({
		row: p.row,
		column: '',
		value: '',
		message: `the CSV is malformed here: ${p.message}`,
		severity: 'error'
	}));
	const issue = (
		row: number,
		column: string,
		value: string,
		message: string,
		severity: UploadIssue['severity'] = 'error'
	) => issues.push({ row, column, value, message, severity });

	// Map headers to columns; the unit in a header applies to its whole column.
	const columns = table.headers.map((header) => ({
		header,
		column: columnForHeader(kind, header)
	}));
	const seen = new Map<string, string>();
	columns.forEach(({ header, column }) => {
		if (!header) return;
		if (!column)
			issue(
				1,
				header,
				header,
				`unknown column, ignored; see the column reference for ${kind} files`,
				'warning'
			);
		else if (seen.has(column.name))
			issue(1, header, header, `the same column as "${seen.get(column.name)}"`);
		else seen.set(column.name, header);
	});
	const present = new Set(seen.keys());
	const missing = new Set<string>();
	for (const c of UPLOAD_COLUMNS[kind]) {
		if (c.required && !present.has(c.name)) {
			missing.add(c.name);
			issue(1, c.name, '', `missing column "${c.name}" (${c.label}); every row needs it`);
		}
	}
	const headerOf = (field: string) => seen.get(field) ?? field;

	const ctx = (header: string) => ({
		decimalComma: table.delimiter === ';',
		headerUnit: headerUnit(header)
	});
	const state: RowState = { kind, lookups, newProteins: new Map(), inFile: new Map() };
	const entries: PlannedEntry[] = [];
	const proteins: PlannedProtein[] = [];

	for (let i = 0; i < table.rows.length; i++) {
		if (i > 0 && i % YIELD_EVERY === 0) await setImmediate();
		const { row, cells } = table.rows[i] as (typeof table.rows)[number];
		const before = issues.length;
		const values: Record<string, unknown> = {};
		const texts: Record<string, string> = {};
		const extras: Record<string, string> = {};
		columns.forEach(({ header, column }, index) => {
			if (!column || seen.get(column.name) !== header) return;
			const text = (cells[index] ?? '').trim();
			texts[column.name] = text;
			if (text === '') return;
			const read = readCell(text, column, ctx(header));
			if (!read.ok) issue(row, header, text, read.message);
			else {
				values[column.name] = read.value;
				Object.assign(extras, read.extra ?? {});
			}
		});
		if (kind === 'potential')
			applyPotentialExtras(values, texts, extras, (col, val, msg) =>
				issue(row, headerOf(col), val, msg)
			);

		const resolved = resolveReferences(state, values, texts, (col, val, msg) =>
			issue(row, headerOf(col), val, msg)
		);
		const parsed = parseEntryInput(kind, stripHelperColumns(values));
		if (!parsed.ok) {
			for (const [field, messages] of Object.entries(parsed.fields)) {
				if (missing.has(field) && messages.every((m) => m === 'required')) continue;
				if (hasIssueSince(issues, before, (x) => x.column === headerOf(field))) continue;
				const message = messages.includes('required')
					? (REQUIRED_HINTS[field] ?? 'required')
					: messages.join('; ');
				issue(row, headerOf(field), texts[field] ?? '', message);
			}
		}
		if (hasIssueSince(issues, before, (x) => x.severity === 'error')) continue;
		if (!parsed.ok || !resolved) continue;

		const warnings: string[] = [];
		const warn = (column: string, value: string, message: string) => {
			warnings.push(message);
			issue(row, headerOf(column), value, message, 'warning');
		};
		const fail = (column: string, value: string, message: string) =>
			issue(row, headerOf(column), value, message);
		if (!domainChecks(state, parsed.entry, resolved, row, texts, warn, fail)) continue;
		if (resolved.newProtein && !state.newProteins.get(resolved.newProtein.key)?.planned) {
			const p = state.newProteins.get(resolved.newProtein.key);
			if (p) {
				p.planned = true;
				proteins.push({ key: p.key, row: p.row, data: p.data });
			}
		}
		entries.push({
			row,
			entry: parsed.entry,
			warnings,
			newProteinKey: resolved.newProtein?.key ?? null
		});
	}

	issues.sort((a, b) => a.row - b.row);
	// Someone else's upload of the same file is none of the uploader's business.
	const previous = options.uploaderId
		? await db
				.selectFrom('submission')
				.select(['id', 'status', 'created_at'])
				.where('content_sha256', '=', sha256)
				.where('submitted_by', '=', options.uploaderId)
				.where('status', '!=', 'withdrawn')
				.orderBy('id', 'desc')
				.executeTakeFirst()
		: undefined;
	return {
		kind,
		sha256,
		byteSize: Buffer.byteLength(text),
		delimiter: table.delimiter,
		rowCount: table.rows.length,
		columns: columns.map((c) => ({ header: c.header, column: c.column?.name ?? null })),
		issues,
		errorCount: issues.filter((i) => i.severity === 'error').length,
		warningCount: issues.filter((i) => i.severity === 'warning').length,
		entries,
		proteins,
		previousUpload: previous
			? { submissionId: previous.id, status: previous.status, createdAt: previous.created_at }
			: null
	};
}

type Report = (column: string, value: string, message: string) => void;

function hasIssueSince(
	issues: UploadIssue[],
	from: number,
	test: (i: UploadIssue) => boolean
): boolean {
	for (let i = from; i < issues.length; i++) if (test(issues[i] as UploadIssue)) return true;
	return false;
}

interface RowState {
	kind: UploadKind;
	lookups: UploadLookups;
	/** Proteins this file creates, by lower-case name and organism. */
	newProteins: Map<string, { key: string; row: number; data: Protein; planned: boolean }>;
	/** Keys of rows already read, for duplicates inside the file: key → row. */
	inFile: Map<string, number>;
}

interface Resolved {
	centres: CentreFact[];
	newProtein: { key: string } | null;
	proteinEntryId: number | null;
}

/** The unit and electrode found in the value's cell or header fill columns the row left empty. */
function applyPotentialExtras(
	values: Record<string, unknown>,
	texts: Record<string, string>,
	extras: Record<string, string>,
	report: Report
) {
	if (extras.reportedUnit && values.reportedUnit === undefined)
		values.reportedUnit = extras.reportedUnit;
	if (extras.referenceElectrode && values.referenceElectrode === undefined) {
		const options =
			UPLOAD_COLUMNS.potential.find((c) => c.name === 'referenceElectrode')?.options ?? [];
		const m = matchOption(extras.referenceElectrode, options);
		if (m.ok) values.referenceElectrode = m.value;
		else
			report(
				'reportedValue',
				texts.reportedValue ?? '',
				`"vs ${extras.referenceElectrode}" names no reference electrode we know${m.suggestion ? `; did you mean "${m.suggestion}"?` : ''}`
			);
	}
}

/** Columns that only find a protein or a centre (or describe a new protein); no entity field has these names. */
const HELPER_COLUMNS = new Set([
	'protein',
	'centreLabel',
	'centreALabel',
	'centreBLabel',
	'proteinName',
	'organism',
	'uniprot',
	'structureIds'
]);

function stripHelperColumns(values: Record<string, unknown>): Record<string, unknown> {
	const entity: Record<string, unknown> = {};
	for (const key in values) if (!HELPER_COLUMNS.has(key)) entity[key] = values[key];
	return entity;
}

function findProtein(
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

function findCentre(
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

function resolveReferences(
	state: RowState,
	values: Record<string, unknown>,
	texts: Record<string, string>,
	report: Report
): Resolved | null {
	const sourceText = texts.sourceAccession;
	if (sourceText && !state.lookups.sources.has(sourceText)) {
		report(
			'sourceAccession',
			sourceText,
			`no source ${sourceText} in the registry (or not visible to you)`
		);
	}
	switch (state.kind) {
		case 'potential':
		case 'spin_record': {
			const c = findCentre(state, values, texts, 'centreAccession', 'centreLabel', report);
			return c ? { centres: [c], newProtein: null, proteinEntryId: c.proteinEntryId } : null;
		}
		case 'distance': {
			const a = findCentre(state, values, texts, 'centreAAccession', 'centreALabel', report);
			const b = findCentre(state, values, texts, 'centreBAccession', 'centreBLabel', report);
			return a && b
				? { centres: [a, b], newProtein: null, proteinEntryId: a.proteinEntryId }
				: null;
		}
		case 'centre':
			return resolveCentreProtein(state, values, texts, report);
	}
}

function resolveCentreProtein(
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

/** Couple, range, duplicates and conflicts. False when the row has an error. */
function domainChecks(
	state: RowState,
	entry: EntryData,
	resolved: Resolved,
	row: number,
	texts: Record<string, string>,
	warn: Report,
	fail: Report
): boolean {
	const inFile = (key: string, column: string): boolean => {
		const first = state.inFile.get(key);
		if (first !== undefined) {
			fail(column, texts[column] ?? '', `repeats row ${first}`);
			return false;
		}
		state.inFile.set(key, row);
		return true;
	};
	switch (entry.kind) {
		case 'potential': {
			const d = entry.data;
			const centre = resolved.centres[0] as CentreFact;
			const allowed = COUPLES_BY_KIND[centre.cofactorKind];
			if (allowed.length > 0 && !allowed.includes(d.couple)) {
				fail(
					'couple',
					d.couple,
					`"${d.couple}" is not a couple of a ${centre.cofactorKind} centre; expected one of ${allowed.join(', ')}`
				);
				return false;
			}
			if (
				!inFile(
					`${d.centreAccession}|${d.couple}|${d.emMvShe}|${d.ph}|${d.temperatureK}|${d.method}`,
					'reportedValue'
				)
			)
				return false;
			const range = checkTypicalRange(centre.cofactorKind, d.couple, d.emMvShe);
			if (range)
				warn(
					'reportedValue',
					texts.reportedValue ?? '',
					`${range.message} (range source: ${range.range.source})`
				);
			for (const p of state.lookups.potentialsByCentreCouple.get(
				`${d.centreAccession}|${d.couple}`
			) ?? []) {
				const same =
					Math.abs(p.emMvShe - d.emMvShe) < 0.05 &&
					p.ph === d.ph &&
					p.temperatureK === d.temperatureK &&
					p.method === d.method;
				if (same)
					warn(
						'reportedValue',
						texts.reportedValue ?? '',
						`already in the registry as ${p.accession}`
					);
				else {
					const c = potentialConflict(d, p);
					if (c)
						warn(
							'reportedValue',
							texts.reportedValue ?? '',
							`conflicts with approved ${p.accession}: ${c.message}`
						);
				}
			}
			return true;
		}
		case 'spin_record': {
			const d = entry.data;
			const key = spinKey(d.centreAccession, d.oxidationLevel, d.method, d.temperatureK);
			if (!inFile(key, 'oxidationLevel')) return false;
			const existing = state.lookups.spinKeys.get(key);
			if (existing)
				warn('oxidationLevel', d.oxidationLevel, `already in the registry as ${existing}`);
			return true;
		}
		case 'distance': {
			const d = entry.data;
			const key = distanceKey(d.centreAAccession, d.centreBAccession, d.structureId);
			if (!inFile(key, 'edgeToEdgeA')) return false;
			const existing = state.lookups.distanceKeys.get(key);
			if (existing) warn('structureId', d.structureId, `already in the registry as ${existing}`);
			return true;
		}
		case 'centre': {
			const d = entry.data;
			const proteinKey = resolved.newProtein?.key ?? String(resolved.proteinEntryId);
			if (!inFile(`${proteinKey}|${d.label.toLowerCase()}`, 'label')) return false;
			if (resolved.proteinEntryId !== null) {
				const existing = state.lookups.centresByProteinLabel.get(
					centreLabelKey(resolved.proteinEntryId, d.label)
				);
				if (existing) warn('label', d.label, `already in the registry as ${existing.accession}`);
			}
			if (resolved.newProtein) {
				const p = state.newProteins.get(resolved.newProtein.key);
				if (p && p.row === 0) p.row = row;
			}
			return true;
		}
		default:
			return true;
	}
}
