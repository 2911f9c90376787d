/*
 * Accessions: `HL` followed by the entry's row id, written with six digits (zero-padded) up to
 * 999 999 and with as many digits as it needs after that (HL1000000, …; never a leading zero
 * there, so every number has exactly one spelling). The number is unique, never reused and says
 * nothing about what the entry is. Every permalink minted with six digits stays valid.
 */

export const ACCESSION_PATTERN = /^HL(?:\d{6}|[1-9]\d{6,11})$/;
/** Twelve digits: far beyond any registry, and still an exact integer in JavaScript and SQLite. */
export const MAX_ACCESSION_NUMBER = 999_999_999_999;
/** How an accession is described in messages. */
export const ACCESSION_HINT = 'an accession: HL followed by six or more digits, e.g. HL000123';

export function isAccession(value: string): boolean {
	return ACCESSION_PATTERN.test(value);
}

/**
 * @throws {RangeError} when the id is not an integer from 1 to MAX_ACCESSION_NUMBER.
 * @example formatAccession(123) // 'HL000123'
 * @example formatAccession(1234567) // 'HL1234567'
 */
export function formatAccession(id: number): string {
	if (!Number.isInteger(id) || id < 1 || id > MAX_ACCESSION_NUMBER) {
		throw new RangeError(`accession numbers run from 1 to ${MAX_ACCESSION_NUMBER}; got ${id}`);
	}
	return `HL${String(id).padStart(6, '0')}`;
}

/** The number inside an accession, or null when the text is not an accession. */
export function accessionNumber(accession: string): number | null {
	return isAccession(accession) ? Number(accession.slice(2)) : null;
}

/** Version segments of permalinks: `v1`, `v2`, … (no leading zeros, no v0). */
export const VERSION_SEGMENT_PATTERN = /^v[1-9]\d{0,5}$/;

export function parseVersionSegment(segment: string): number | null {
	return VERSION_SEGMENT_PATTERN.test(segment) ? Number(segment.slice(1)) : null;
}

/** Permalink path of an entry, optionally of one version. */
export function permalinkPath(accession: string, version?: number): string {
	return version === undefined ? `/e/${accession}` : `/e/${accession}/v${version}`;
}
