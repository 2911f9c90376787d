import type { Kysely } from 'kysely';
import { DomainError } from '$lib/domainError';
import type { CalendarDate } from '$lib/catalogue/accessDate';
import { CITATION_FILES, citeRecord, type CitationFileExtension } from '$lib/catalogue/citation';
import { getEntryView } from '../catalogue/entryView';
import type { Viewer } from '../catalogue/visibility';
import type { Database } from '../db/schema';
import { entryCitation } from './citable';

/*
 * A version's citation as a file: BibTeX, RIS or CSL-JSON, with its media type and a file name.
 * Without an access date the bytes are those of the version forever; with one, they differ only
 * by it.
 */

/** An access date no reader anywhere can have today: 400 on `accessed`. */
export class AccessDateError extends DomainError {
	constructor(message: string) {
		super('bad_request', message, { fields: { accessed: [message] } });
		this.name = 'AccessDateError';
	}
}

/**
 * Refuses an access date outside the dates the calendar shows somewhere on Earth at `now`
 * (time zones run from UTC−12 to UTC+14): the server never writes a date nobody could be
 * reading it on.
 * @throws {AccessDateError}
 */
export function checkAccessDate(date: CalendarDate, now: Date): void {
	const earliest = new Date(now.getTime() - 12 * 3_600_000).toISOString().slice(0, 10);
	const latest = new Date(now.getTime() + 14 * 3_600_000).toISOString().slice(0, 10);
	if (date < earliest || date > latest) {
		throw new AccessDateError(
			`${date} is not today's date anywhere (it is ${earliest} to ${latest} now, depending on the time zone)`
		);
	}
}

export interface CitationFile {
	body: string;
	mediaType: string;
	filename: string;
}

/**
 * @throws {EntryNotFoundError} for an entry or version the reader may not see.
 * @throws {AccessDateError}
 */
export async function citationFile(
	db: Kysely<Database>,
	request: {
		accession: string;
		version: number;
		extension: CitationFileExtension;
		accessed: CalendarDate | null;
	},
	viewer: Viewer | null,
	origin: string,
	now: Date = new Date()
): Promise<CitationFile> {
	if (request.accessed !== null) checkAccessDate(request.accessed, now);
	const view = await getEntryView(db, request.accession, request.version, viewer);
	const { record } = await entryCitation(db, view, origin);
	const file = CITATION_FILES[request.extension];
	return {
		body: citeRecord(record, request.accessed)[file.format],
		mediaType: `${file.mediaType}; charset=utf-8`,
		filename: `${record.accession}-v${record.version}.${request.extension}`
	};
}
