import type { Kysely } from 'kysely';
import type { EntryView, LinkedReference } from '$lib/catalogue/dto';
import { originalKey, type CitableRecord, type OriginalWork } from '$lib/catalogue/citation';
import type { EntryCitation } from '$lib/catalogue/entryMetadata';
import { permalinkPath } from '$lib/schemas/accession';
import { sourceSchema } from '$lib/schemas/source';
import { versionCredit } from '../catalogue/credit';
import { readJson } from '../db/json';
import type { Database } from '../db/schema';

/*
 * What a version's citations and page metadata say, from what its entry view shows: the title
 * the view gives, the people credited when the version was approved (catalogue/credit.ts), the
 * entries it refers to at the versions it was approved against, and the work its source entry
 * describes. Everything here is frozen with the version: nothing depends on entries approved
 * after it. The view has already left out references the reader may not see.
 */

/** The entries a version names, at the versions it was approved against (the view pins them). */
function pinnedReferences(view: EntryView, origin: string): LinkedReference[] {
	return Object.values(view.references).map(({ accession, version, kind, title }) => ({
		accession,
		version,
		kind,
		title,
		permalink: new URL(permalinkPath(accession, version), origin).href
	}));
}

/** A source's stored data as the work it describes, or null when it does not read as a source. */
function originalWork(
	data: unknown,
	record: { accession: string; version: number; permalink: string }
): OriginalWork | null {
	const parsed = sourceSchema.safeParse(data);
	if (!parsed.success) return null;
	const s = parsed.data;
	return {
		key: originalKey(s.authors, s.year, record.accession),
		sourceKind: s.sourceKind,
		title: s.title,
		authors: s.authors,
		journal: s.journal,
		year: s.year,
		doi: s.doi,
		pubmedId: s.pubmedId,
		record
	};
}

async function sourceData(
	db: Kysely<Database>,
	accession: string,
	version: number
): Promise<unknown> {
	const row = await db
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select('entry_version.data')
		.where('entry.accession', '=', accession)
		.where('entry_version.version', '=', version)
		.where('entry_version.status', '=', 'approved')
		.executeTakeFirst();
	return row ? readJson(row.data) : null;
}

/**
 * The citation of the version an entry view shows, and the entries it is based on.
 * @param origin the site's origin, for absolute permalinks.
 */
export async function entryCitation(
	db: Kysely<Database>,
	view: EntryView,
	origin: string
): Promise<EntryCitation> {
	const entry = await db
		.selectFrom('entry')
		.select('id')
		.where('accession', '=', view.accession)
		.executeTakeFirstOrThrow();
	const credit = await versionCredit(db, entry.id, view.version);
	const permalink = new URL(permalinkPath(view.accession, view.version), origin).href;
	const basedOn = pinnedReferences(view, origin);

	let original: OriginalWork | null = null;
	if (view.kind === 'source') {
		original = originalWork(view.data, {
			accession: view.accession,
			version: view.version,
			permalink
		});
	} else {
		const source = basedOn.find((r) => r.kind === 'source');
		if (source) {
			original = originalWork(await sourceData(db, source.accession, source.version), {
				accession: source.accession,
				version: source.version,
				permalink: source.permalink
			});
		}
	}

	const record: CitableRecord = {
		accession: view.accession,
		version: view.version,
		kind: view.kind,
		title: view.title,
		permalink,
		approvedAt: view.approvedAt,
		authors: credit.authors,
		editors: credit.editors,
		original
	};
	return { record, basedOn };
}
