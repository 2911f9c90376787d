import type { Kysely } from 'kysely';
import type { Database } from '../db/schema';
import { readCatalogueRevision } from '../db/revision';

/**
 * How long what a signed-out reader sees stays as it is: until the revision moves, or until
 * the next embargo ends (an entry turns public without a write), or until the next UTC
 * midnight (citations carry the date they were accessed) — whichever comes first.
 */
export interface CatalogueValidity {
	revision: number;
	/** Epoch milliseconds. */
	validUntil: number;
}

export async function nextEmbargoEnd(db: Kysely<Database>, now: Date): Promise<number | null> {
	const { until } = await db
		.selectFrom('entry')
		.select((eb) => eb.fn.min('embargo_until').as('until'))
		.where('visibility', '=', 'embargoed')
		.where('embargo_until', '>', now.toISOString())
		.executeTakeFirstOrThrow();
	return until === null ? null : Date.parse(until);
}

export function nextUtcMidnight(now: Date): number {
	return Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + 1);
}

/**
 * The validity of the catalogue as read now, remembered per process: one indexed read of the
 * revision per call, and a scan for the next embargo only when the revision has moved or the
 * remembered validity has run out.
 */
export function catalogueValidityReader(db: Kysely<Database>) {
	let known: CatalogueValidity | null = null;
	return async function currentValidity(now = new Date()): Promise<CatalogueValidity> {
		const revision = await readCatalogueRevision(db);
		if (known && known.revision === revision && now.getTime() < known.validUntil) return known;
		const embargoEnd = await nextEmbargoEnd(db, now);
		const midnight = nextUtcMidnight(now);
		known = {
			revision,
			validUntil: embargoEnd === null ? midnight : Math.min(embargoEnd, midnight)
		};
		return known;
	};
}
