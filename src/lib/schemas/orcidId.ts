/*
 * ORCID iDs as a person records them on their account and as citations carry them: the form of
 * an iD and its URL, apart from the input schema (orcid.ts) so that the pages showing an iD load
 * no schema library. Only the form is checked (sixteen characters and the check character):
 * nobody asks ORCID whether the iD exists or belongs to the person, so citations present it as
 * the person declared it.
 */

/** The canonical form: four groups of four, hyphenated; the last character may be X. */
export const ORCID_PATTERN = /^\d{4}-\d{4}-\d{4}-\d{3}[\dX]$/;

/**
 * The check character of the first fifteen digits of an ORCID iD: ISO 7064 MOD 11-2, as the
 * ORCID documentation ("Structure of the ORCID Identifier") computes it.
 * @throws {TypeError} when `base` is not fifteen digits.
 */
export function orcidCheckCharacter(base: string): string {
	if (!/^\d{15}$/.test(base)) throw new TypeError(`base must be 15 digits, got "${base}"`);
	let total = 0;
	for (const digit of base) total = (total + Number(digit)) * 2;
	const result = (12 - (total % 11)) % 11;
	return result === 10 ? 'X' : String(result);
}

/** True for an iD in canonical form whose check character matches. */
export function isValidOrcid(id: string): boolean {
	if (!ORCID_PATTERN.test(id)) return false;
	const digits = id.replaceAll('-', '');
	return orcidCheckCharacter(digits.slice(0, 15)) === digits[15];
}

/** The iD as a URL, the form ORCID asks everyone to display. */
export function orcidUrl(id: string): string {
	return `https://orcid.org/${id}`;
}
