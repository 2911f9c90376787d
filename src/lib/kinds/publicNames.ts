/*
 * Public names of fields whose stored names end in a bare `A` for ångström (`edgeToEdgeA`),
 * which reads as "centre A" beside `centreAAccession`. The API, CSV output and CSV upload
 * columns say `Angstrom` / `_angstrom`; the stored JSON of every version keeps the names it
 * was approved with, because approved versions are frozen (SQLite refuses to rewrite them) and
 * one stored shape is simpler than two. So the names are mapped at the edges, here, and only
 * here: what leaves (entries API `data`, submissions API) is renamed, what arrives (API bodies,
 * CSV headers) may use either name.
 */

/** Stored field name → public name. */
export const PUBLIC_FIELD_NAMES: Readonly<Record<string, string>> = {
	edgeToEdgeA: 'edgeToEdgeAngstrom',
	centreToCentreA: 'centreToCentreAngstrom',
	coordinatesA: 'coordinatesAngstrom'
};

const STORED_FIELD_NAMES: Readonly<Record<string, string>> = Object.fromEntries(
	Object.entries(PUBLIC_FIELD_NAMES).map(([stored, shown]) => [shown, stored])
);

/** The name clients see for a stored field (unchanged for all but the ångström fields). */
export function publicFieldName(stored: string): string {
	return PUBLIC_FIELD_NAMES[stored] ?? stored;
}

/** The stored name of a field a client named by its public or its stored name. */
export function storedFieldName(name: string): string {
	return STORED_FIELD_NAMES[name] ?? name;
}

/** A version's data with public field names, in the same order. */
export function toPublicFields(data: Record<string, unknown>): Record<string, unknown> {
	return Object.fromEntries(Object.entries(data).map(([k, v]) => [publicFieldName(k), v]));
}

/**
 * Data a client sent, with stored field names. Either name is accepted; a field given under
 * both names is reported (under its public name) rather than one silently winning.
 */
export function fromPublicFields(
	data: Record<string, unknown>
): { ok: true; data: Record<string, unknown> } | { ok: false; fields: Record<string, string[]> } {
	const out: Record<string, unknown> = {};
	const fields: Record<string, string[]> = {};
	for (const [name, value] of Object.entries(data)) {
		const stored = storedFieldName(name);
		if (stored in out)
			fields[publicFieldName(stored)] = [
				`given twice, as ${publicFieldName(stored)} and as ${stored}; send one`
			];
		out[stored] = value;
	}
	return Object.keys(fields).length > 0 ? { ok: false, fields } : { ok: true, data: out };
}
