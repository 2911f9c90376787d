import { z } from 'zod';

/*
 * Warnings on a proposed version: things a curator should look at twice, none of which stops a
 * submission. Computed for a form's version when it is read (`curation/checks.ts`), and for each
 * row of a CSV file when it is checked, then stored with the row's version as JSON
 * (`entry_version.warnings`, a list of these; migration 0006 turned the older English text into
 * them). Queues count them by kind in SQL (`json_each`), never by matching words.
 */

export const VERSION_WARNING_KINDS = [
	/** Outside the typical range of the cofactor kind and couple. */
	'range',
	/** Differs from an approved value at comparable conditions beyond their stated uncertainties. */
	'conflict',
	/** The same value is in the registry already. */
	'duplicate',
	/** Stored before warnings had kinds and fitting none of them (kept as written). */
	'other'
] as const;
export type VersionWarningKind = (typeof VERSION_WARNING_KINDS)[number];

export const versionWarningSchema = z.object({
	kind: z.enum(VERSION_WARNING_KINDS),
	/** The field (a form field, a CSV column's field name) the warning is about. */
	field: z.string(),
	message: z.string(),
	/** Where the rule or the range comes from. */
	source: z.string().optional(),
	/** The approved entry the value repeats or differs from. */
	accession: z.string().optional()
});
export type VersionWarning = z.infer<typeof versionWarningSchema>;

const storedWarningsSchema = z.array(versionWarningSchema);

/**
 * The warnings stored with a version (null: none).
 * @throws {Error} when the column holds anything but a list of warnings: the database is then
 * not what migration 0006 and the writers leave, which is a fault, not a reader's error.
 */
export function parseStoredWarnings(stored: string | null): VersionWarning[] {
	if (stored === null) return [];
	const parsed = storedWarningsSchema.safeParse(JSON.parse(stored));
	if (!parsed.success) {
		throw new Error(`stored version warnings are malformed: ${parsed.error.message}`);
	}
	return parsed.data;
}

/** What is stored for a version's warnings: null when there are none. */
export function storeWarnings(warnings: readonly VersionWarning[]): string | null {
	return warnings.length ? JSON.stringify(warnings) : null;
}
