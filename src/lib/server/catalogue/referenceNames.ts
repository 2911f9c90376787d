import type { Kysely } from 'kysely';
import { referencesOf, type EntryKind } from '$lib/kinds';
import { ACCESSION_PATTERN } from '$lib/schemas/accession';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';
import { versionTitle } from '../kinds';
import { pinsOf } from './entryView';
import type { Viewer } from './visibility';
import { findVisibleEntry } from './visibleEntry';

/*
 * The names of the entries a submission's versions refer to (a potential's centre and source, a
 * centre's protein), for review and submission pages: each accession with the title of its
 * latest approved version. Only entries the reader may see are named (findVisibleEntry: the
 * entry and everything it depends on); any other accession — hidden, pending, or unknown —
 * gets no name, so a page shows it as typed and learns nothing more about it.
 */

export interface ReferenceName {
	accession: string;
	kind: EntryKind;
	title: string;
}

/** At most this many distinct accessions are named per page (a batch page names far fewer). */
const MAX_NAMED = 500;

/** The accessions the reference fields of these versions' data hold. */
export function referencedAccessions(
	versions: Iterable<{ kind: EntryKind; data: Record<string, unknown> }>
): Set<string> {
	const found = new Set<string>();
	for (const v of versions) {
		for (const field of Object.keys(referencesOf(v.kind))) {
			const value = v.data[field];
			if (typeof value === 'string' && ACCESSION_PATTERN.test(value)) found.add(value);
		}
	}
	return found;
}

/** The title of one visible entry at its latest approved version, from its pinned references. */
async function titleOf(
	db: Kysely<Database>,
	entryId: number,
	kind: EntryKind,
	viewer: Viewer | null
): Promise<string | null> {
	const latest = await db
		.selectFrom('entry_version')
		.select(['id', 'data'])
		.where('entry_id', '=', entryId)
		.where('status', '=', 'approved')
		.orderBy('version', 'desc')
		.limit(1)
		.executeTakeFirst();
	if (!latest) return null;
	const pins = (await pinsOf(db, [latest.id])).get(latest.id) ?? [];
	const refs: Record<string, Record<string, unknown>> = {};
	for (const p of pins) {
		// A title never names what the reader may not see.
		if (await findVisibleEntry(db, p.accession, viewer)) refs[p.field] = p.data;
	}
	return versionTitle(kind, readJson(latest.data), refs);
}

/** Names of the accessions the viewer may see, by accession; the others are left out. */
export async function referenceNames(
	db: Kysely<Database>,
	viewer: Viewer | null,
	accessions: Iterable<string>
): Promise<Record<string, ReferenceName>> {
	const names: Record<string, ReferenceName> = {};
	for (const accession of [...new Set(accessions)].slice(0, MAX_NAMED)) {
		const entry = await findVisibleEntry(db, accession, viewer);
		if (!entry) continue;
		const title = await titleOf(db, entry.id, entry.kind, viewer);
		if (title) names[accession] = { accession, kind: entry.kind, title };
	}
	return names;
}

/**
 * The names a submission page shows: of what its form versions and the shown page of its batch
 * rows refer to, as the reader may see them.
 */
export function namesForSubmissionPage(
	db: Kysely<Database>,
	viewer: Viewer | null,
	versions: readonly { kind: EntryKind; data: Record<string, unknown> }[],
	batchRows: readonly { values: readonly { accession?: string }[] }[] = []
): Promise<Record<string, ReferenceName>> {
	const accessions = referencedAccessions(versions);
	for (const r of batchRows) for (const v of r.values) if (v.accession) accessions.add(v.accession);
	return referenceNames(db, viewer, accessions);
}
