import { sql, type Kysely } from 'kysely';
import {
	ENTRY_KIND_LABELS,
	KINDS,
	fieldLabel,
	formatKindField,
	referencesOf,
	type EntryKind
} from '$lib/kinds';
import {
	parseStoredWarnings,
	type VersionWarning,
	type VersionWarningKind
} from '$lib/schemas/versionWarning';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';

/*
 * The rows of a CSV batch, read from what was stored when its file was committed (each version's
 * file row and warnings), so a batch of 100 000 rows is reviewed page by page without being
 * checked again.
 */

/** 1 for a version whose stored warnings include one of `kind`, else null (for `count`). */
const hasWarningOf = (kind: VersionWarningKind) =>
	sql<number | null>`case when exists (select 1 from json_each(entry_version.warnings) as w
		where w.value ->> 'kind' = ${kind}) then 1 end`;

/**
 * A CSV batch's kinds and flags from the warnings stored when its file was checked: how many
 * rows are outside a typical range, and how many conflict with an approved value.
 */
export async function batchFlagCounts(db: Kysely<Database>, submissionId: number) {
	const rows = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select((eb) => [
			'entry.kind',
			eb.fn.countAll<number>().as('n'),
			eb.fn.count<number>(hasWarningOf('range')).as('range'),
			eb.fn.count<number>(hasWarningOf('conflict')).as('conflicts')
		])
		.where('entry_version.submission_id', '=', submissionId)
		.groupBy('entry.kind')
		.execute();
	return {
		kinds: rows.map((r) => r.kind),
		rangeWarnings: rows.reduce((a, r) => a + Number(r.range), 0),
		conflicts: rows.reduce((a, r) => a + Number(r.conflicts), 0)
	};
}

export interface BatchRow {
	versionId: number;
	row: number | null;
	accession: string;
	kind: EntryKind;
	kindLabel: string;
	status: string;
	/**
	 * The kind's list fields (src/lib/kinds), as text; a field naming another entry also carries
	 * the accession it holds, for the page to name.
	 */
	values: { field: string; label: string; text: string; accession?: string }[];
	warnings: VersionWarning[];
	comments: string[];
}

function listValues(kind: EntryKind, data: Record<string, unknown>): BatchRow['values'] {
	const references = referencesOf(kind);
	return KINDS[kind].listFields.map((field) => {
		const value = data[field];
		return {
			field,
			label: fieldLabel(kind, field),
			text: formatKindField(kind, field, value),
			...(Object.hasOwn(references, field) && typeof value === 'string' ? { accession: value } : {})
		};
	});
}

/** One page of a CSV batch's rows in file order; `flagged` keeps rows with warnings. */
export async function loadBatchRows(
	db: Kysely<Database>,
	submissionId: number,
	options: { offset: number; limit: number; flagged: boolean }
) {
	let q = db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.where('entry_version.submission_id', '=', submissionId);
	if (options.flagged) q = q.where('entry_version.warnings', 'is not', null);
	const total = Number(
		(await q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n
	);
	const rows = await q
		.select([
			'entry_version.id',
			'entry_version.row_number',
			'entry_version.status',
			'entry_version.data',
			'entry_version.warnings',
			'entry.accession',
			'entry.kind'
		])
		.orderBy('entry_version.row_number')
		.orderBy('entry_version.id')
		.limit(options.limit)
		.offset(options.offset)
		.execute();
	const comments = await db
		.selectFrom('submission_comment')
		.select(['entry_version_id', 'body'])
		.where('submission_id', '=', submissionId)
		.where('entry_version_id', 'in', rows.length ? rows.map((r) => r.id) : [-1])
		.execute();
	const statuses = await db
		.selectFrom('entry_version')
		.select((eb) => ['status', eb.fn.countAll<number>().as('n')])
		.where('submission_id', '=', submissionId)
		.groupBy('status')
		.execute();
	return {
		total,
		statuses: Object.fromEntries(statuses.map((s) => [s.status, Number(s.n)])),
		rows: rows.map((r): BatchRow => ({
			versionId: r.id,
			row: r.row_number,
			accession: r.accession,
			kind: r.kind,
			kindLabel: ENTRY_KIND_LABELS[r.kind],
			status: r.status,
			values: listValues(r.kind, readJson(r.data)),
			warnings: parseStoredWarnings(r.warnings),
			comments: comments.filter((c) => c.entry_version_id === r.id).map((c) => c.body)
		}))
	};
}
