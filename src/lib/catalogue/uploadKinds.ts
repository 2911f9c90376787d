// The kinds of CSV upload and how headers are matched to columns: what the upload page needs in
// the browser. The columns themselves (uploadColumns.ts) come from the kinds' schemas and reach
// the browser as page data.

export const UPLOAD_KINDS = ['potential', 'spin_record', 'distance', 'centre'] as const;
export type UploadKind = (typeof UPLOAD_KINDS)[number];

export const UPLOAD_KIND_LABELS: Record<UploadKind, string> = {
	potential: 'Potentials',
	spin_record: 'Spin records',
	distance: 'Distances',
	centre: 'Centres and proteins'
};

/** What one row of each kind of file is, in the plural, for titles and counts. */
export const UPLOAD_KIND_NOUNS: Record<UploadKind, string> = {
	potential: 'potentials',
	spin_record: 'spin records',
	distance: 'distances',
	centre: 'centres'
};

/** What a header is matched against: the column's name, label and aliases. */
export interface HeaderNames {
	name: string;
	label: string;
	/** Other header spellings accepted (compared without case, spaces, units or punctuation). */
	aliases: readonly string[];
}

/** A header as people write it, reduced for matching: no case, units, spaces or punctuation. */
export function headerKey(header: string): string {
	return header
		.replace(/[([{].*?[)\]}]/g, '')
		.replace(/\/\s*(mV|V|K|°C|Å|M)\s*$/i, '')
		.toLowerCase()
		.replace(/[^a-z0-9]/g, '');
}

/** The column a header names among `columns`, or null. */
export function matchHeader<C extends HeaderNames>(
	columns: readonly C[],
	header: string
): C | null {
	const key = headerKey(header);
	if (!key) return null;
	for (const c of columns) {
		if (headerKey(c.name) === key || headerKey(c.label) === key) return c;
		if (c.aliases.some((a) => headerKey(a) === key)) return c;
	}
	return null;
}
