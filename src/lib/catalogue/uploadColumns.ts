import Papa from 'papaparse';
import { KINDS, UPLOAD_KINDS, type UploadKind } from '$lib/kinds';
import type { UploadColumn } from '$lib/kinds/csvColumns';
import { matchHeader, type HeaderNames } from './headerMatch';

export type { UploadColumn } from '$lib/kinds/csvColumns';

/** The columns of each kind of CSV upload, as the kinds' modules list them (src/lib/kinds). */
export const UPLOAD_COLUMNS = Object.fromEntries(
	UPLOAD_KINDS.map((kind): [UploadKind, readonly UploadColumn[]] => [
		kind,
		KINDS[kind].upload.columns
	])
) as Record<UploadKind, readonly UploadColumn[]>;

/** The column of a kind's file that a header names, or null. */
export function columnForHeader(kind: UploadKind, header: string): UploadColumn | null {
	return matchHeader(UPLOAD_COLUMNS[kind], header);
}

/** What the browser needs to recognise headers (the page's data, so no schema ships with it). */
export function headerNames(kind: UploadKind): HeaderNames[] {
	return UPLOAD_COLUMNS[kind].map(({ name, header, label, aliases }) => ({
		name,
		header,
		label,
		aliases
	}));
}

/** The template: the header row and one invented example row, marked so that no check passes it. */
export function templateCsv(kind: UploadKind): string {
	const columns = UPLOAD_COLUMNS[kind];
	return Papa.unparse(
		{ fields: columns.map((c) => c.header), data: [columns.map((c) => c.example)] },
		{ newline: '\r\n' }
	);
}
