import { KINDS, formatKindField, type KindUpload } from '$lib/kinds';
import type { CheckSummary } from '$lib/schemas/curationResponses';
import type { UploadCheck } from './checkUpload';

export type { CheckSummary };

/** What a page shows of a check: counts, the first issues, and a preview of what would be created. */
export function summariseCheck(
	check: UploadCheck,
	limits: { issues: number; preview: number }
): CheckSummary {
	const upload: KindUpload = KINDS[check.kind].upload;
	const derived = (n: string) => upload.derivedFields?.[n] ?? null;
	const fields = upload.columns
		.map((c) => c.name)
		.filter((n) => check.entries.some((e) => (e.entry.data as Record<string, unknown>)[n] != null))
		.flatMap((n) => (derived(n) ? [n, derived(n) as string] : [n]));
	return {
		kind: check.kind,
		sha256: check.sha256,
		byteSize: check.byteSize,
		delimiter: check.delimiter === '\t' ? 'tab' : check.delimiter,
		rowCount: check.rowCount,
		columns: check.columns,
		errorCount: check.errorCount,
		warningCount: check.warningCount,
		wouldCreate: { entries: check.entries.length, proteins: check.proteins.length },
		previousUpload: check.previousUpload,
		issues: check.issues.slice(0, limits.issues),
		moreIssues: Math.max(0, check.issues.length - limits.issues),
		preview: {
			fields,
			rows: check.entries.slice(0, limits.preview).map((e) => ({
				row: e.row,
				warnings: e.warnings.length,
				cells: fields.map((f) =>
					formatKindField(check.kind, f, (e.entry.data as Record<string, unknown>)[f])
				)
			}))
		}
	};
}
