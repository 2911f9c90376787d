import { createHash } from 'node:crypto';
import { setImmediate } from 'node:timers/promises';
import type { Kysely } from 'kysely';
import type { CsvLimits } from '$lib/catalogue/csvRecords';
import { UPLOAD_COLUMNS, columnForHeader } from '$lib/catalogue/uploadColumns';
import { EXAMPLE_ROW_MESSAGE, isTemplateExampleRow } from '$lib/kinds/csvColumns';
import { publicFieldName } from '$lib/kinds/publicNames';
import { KINDS, type UploadKind } from '$lib/kinds';
import type { EntryData } from '$lib/schemas/entryData';
import type { UploadIssue } from '$lib/schemas/curationResponses';
import type { Protein } from '$lib/schemas/protein';
import { parseEntryInput } from '$lib/schemas/submission';
import { warningText } from '$lib/catalogue/warningText';
import type { VersionWarning } from '$lib/schemas/versionWarning';
import type { Database } from '../db/schema';
import type { Viewer } from '../catalogue/visibility';
import { uploadRules } from '../kinds';
import { headerUnit, readCell } from './cells';
import { loadUploadLookups } from './lookups';
import { readCsv } from './readCsv';
import type { RowState, UploadRow } from './rows';

/*
 * Checks a CSV upload row by row against the zod schemas and the registry, and plans what a
 * commit would create. Nothing is written here: "Check only" and the commit both start from it.
 */
export type { UploadIssue };

export interface PlannedEntry {
	row: number;
	entry: EntryData;
	warnings: VersionWarning[];
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
	const rules = uploadRules(kind);
	const existing = await rules.loadExisting?.(db, options.viewer, lookups);
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
			issue(1, c.header, '', `missing column "${c.header}" (${c.label}); every row needs it`);
		}
	}
	const headerOf = (field: string) => seen.get(field) ?? publicFieldName(field);

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
		const warnings: VersionWarning[] = [];
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
		const r: UploadRow = {
			state,
			row,
			values,
			texts,
			fail: (column, value, message) => issue(row, headerOf(column), value, message),
			warn: (kind, column, value, message, detail) => {
				const warning: VersionWarning = { kind, field: column, message, ...detail };
				warnings.push(warning);
				issue(row, headerOf(column), value, warningText(warning), 'warning');
			}
		};
		// The template's example row is refused as data, whatever else it holds.
		if (isTemplateExampleRow(texts.note)) r.fail('note', texts.note ?? '', EXAMPLE_ROW_MESSAGE);
		rules.prepare?.(r, extras);
		const sourceText = texts.sourceAccession;
		if (sourceText && !lookups.sources.has(sourceText))
			r.fail(
				'sourceAccession',
				sourceText,
				`no source ${sourceText} in the registry (or not visible to you)`
			);
		const resolved = rules.resolve(r);
		const parsed = parseEntryInput(kind, dataFields(kind, values));
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

		if (!rules.check(r, parsed.entry.data, resolved, existing)) continue;
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

function hasIssueSince(
	issues: UploadIssue[],
	from: number,
	test: (i: UploadIssue) => boolean
): boolean {
	for (let i = from; i < issues.length; i++) if (test(issues[i] as UploadIssue)) return true;
	return false;
}

/** The row's values for the kind's data: columns that only find or describe entries left out. */
function dataFields(kind: UploadKind, values: Record<string, unknown>): Record<string, unknown> {
	const data: Record<string, unknown> = {};
	for (const f of KINDS[kind].formFields) if (f.name in values) data[f.name] = values[f.name];
	return data;
}
