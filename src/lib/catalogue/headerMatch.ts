// How the headers people write are matched to a CSV upload's columns: in the browser, as a
// file is chosen, and on the server, as it is checked.

/** What a header is matched against: the column's name, label and aliases. */
export interface HeaderNames {
	name: string;
	/** The column's name in templates, when it differs from `name`. */
	header?: string;
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
		if (headerKey(c.header ?? c.name) === key || headerKey(c.label) === key) return c;
		if (headerKey(c.name) === key) return c;
		if (c.aliases.some((a) => headerKey(a) === key)) return c;
	}
	return null;
}
