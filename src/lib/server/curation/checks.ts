import type { Kysely } from 'kysely';
import { conflictWarning, potentialConflict } from '$lib/catalogue/conflicts';
import { checkTypicalRange } from '$lib/catalogue/typicalRanges';
import type { EntryData } from '$lib/schemas/entryData';
import type { VersionWarning } from '$lib/schemas/versionWarning';
import type { Database } from '../db/schema';
import { potentialIsVisible, type Viewer } from '../catalogue/visibility';
import { findVisibleEntry } from '../catalogue/visibleEntry';

/*
 * Warnings on a proposed form version (see `VersionWarning`), computed when it is read: none of
 * them stops a submission. Errors (a reference that does not resolve) are checked elsewhere.
 */
export type { VersionWarning };

/** Who the warnings are for: curators compare with every approved value, others with what they may see. */
export type WarningAudience = Viewer | null | 'curator';

export async function warningsForVersion(
	db: Kysely<Database>,
	entry: EntryData,
	options: { entryId: number | null; audience: WarningAudience }
): Promise<VersionWarning[]> {
	if (entry.kind !== 'potential') return [];
	const d = entry.data;
	const audience = options.audience;
	// A centre the reader may not see gives no warning at all: even a range warning would name
	// its cofactor kind.
	if (audience !== 'curator' && !(await findVisibleEntry(db, d.centreAccession, audience))) {
		return [];
	}
	const centre = await db
		.selectFrom('centre')
		.innerJoin('entry', 'entry.id', 'centre.entry_id')
		.select(['centre.entry_id', 'centre.cofactor_kind'])
		.where('entry.accession', '=', d.centreAccession)
		.executeTakeFirst();
	if (!centre) return [];
	const warnings: VersionWarning[] = [];
	const range = checkTypicalRange(centre.cofactor_kind, d.couple, d.emMvShe);
	if (range) {
		warnings.push({
			kind: 'range',
			field: 'reportedValue',
			message: range.message,
			source: range.range.source
		});
	}
	let others = db
		.selectFrom('potential')
		.select(['accession', 'couple', 'em_mv_she', 'uncertainty_mv', 'ph', 'temperature_k'])
		.where('centre_entry_id', '=', centre.entry_id)
		.where('couple', '=', d.couple);
	if (options.entryId !== null) others = others.where('entry_id', '!=', options.entryId);
	if (audience !== 'curator')
		others = others.where((eb) => potentialIsVisible(eb, 'potential', audience));
	for (const other of await others.execute()) {
		const conflict = potentialConflict(d, {
			couple: other.couple,
			emMvShe: other.em_mv_she,
			uncertaintyMv: other.uncertainty_mv,
			ph: other.ph,
			temperatureK: other.temperature_k
		});
		// The one rule of entry pages and CSV checks (conflicts.ts: k = 2, GUM §6.2–6.3).
		if (conflict) {
			warnings.push({
				kind: 'conflict',
				field: 'reportedValue',
				...conflictWarning({ accession: other.accession, emMvShe: other.em_mv_she }, conflict)
			});
		}
	}
	return warnings;
}
