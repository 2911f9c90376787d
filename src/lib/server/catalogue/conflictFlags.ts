import type { Kysely } from 'kysely';
import {
	conflictsForShown,
	type ConflictSummary,
	type ListedPotential
} from '$lib/catalogue/conflicts';
import type { Database } from '../db/schema';
import { COMPARABLE_COLUMNS, toComparable } from './comparablePotential';
import { potentialIsVisible, type Viewer } from './visibility';

/*
 * Conflict flags for the potentials a page shows, against the approved values of the same
 * centres and couples that the reader may see. At most CANDIDATE_CAP values are read, however
 * many a centre holds, so one page view costs bounded time and memory; the page says so when
 * the cap was reached. The rule itself is `potentialConflict` (catalogue/conflicts.ts): the
 * same for these flags, curation checks and CSV checks.
 */
export const CANDIDATE_CAP = 20_000;

export interface ConflictFlags {
	flags: Record<string, ConflictSummary>;
	/** True when the centres hold more comparable values than were read. */
	truncated: boolean;
	/** Accessions of shown values that state no uncertainty, and so are never compared. */
	notCompared: string[];
}

export async function conflictFlags(
	db: Kysely<Database>,
	shown: readonly ListedPotential[],
	viewer: Viewer | null
): Promise<ConflictFlags> {
	const notCompared = shown.filter((p) => p.uncertaintyMv === null).map((p) => p.accession);
	if (shown.length === notCompared.length) return { flags: {}, truncated: false, notCompared };
	const centres = [...new Set(shown.map((p) => p.centre.accession))];
	const couples = [...new Set(shown.map((p) => p.couple))];
	const rows = await db
		.selectFrom('potential as p')
		.select(COMPARABLE_COLUMNS)
		// By centre id, which the read model indexes.
		.where('p.centre_entry_id', 'in', (eb) =>
			eb.selectFrom('entry').select('entry.id').where('entry.accession', 'in', centres)
		)
		.where('p.couple', 'in', couples)
		// A value without a stated uncertainty is never compared (the rule, conflicts.ts).
		.where('p.uncertainty_mv', 'is not', null)
		.where((eb) => potentialIsVisible(eb, 'p', viewer))
		.orderBy('p.entry_id')
		.limit(CANDIDATE_CAP + 1)
		.execute();
	const truncated = rows.length > CANDIDATE_CAP;
	const candidates = rows.slice(0, CANDIDATE_CAP).map(toComparable);
	return {
		flags: Object.fromEntries(conflictsForShown(shown, candidates)),
		truncated,
		notCompared
	};
}

/** Conflict flags of one approved potential (its latest approved values). */
export async function conflictFlagsOfPotential(
	db: Kysely<Database>,
	accession: string,
	viewer: Viewer | null
): Promise<ConflictFlags> {
	const row = await db
		.selectFrom('potential as p')
		.select(COMPARABLE_COLUMNS)
		.where('p.accession', '=', accession)
		.executeTakeFirst();
	if (!row) return { flags: {}, truncated: false, notCompared: [] };
	return conflictFlags(db, [toComparable(row)], viewer);
}
