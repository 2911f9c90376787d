import { z } from 'zod';

/*
 * ORCID iDs as a person records them on their account and as citations carry them. Only the
 * form is checked (sixteen characters and the check character): nobody asks ORCID whether the
 * iD exists or belongs to the person, so citations present it as the person declared it.
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

const EXAMPLE = '0000-0002-1825-0097';

/**
 * What a person types: the iD with or without hyphens or spaces, or its orcid.org URL; a small
 * x is read as X. Empty means "no iD" (null). Gives the canonical form or a message that says
 * which part is wrong.
 */
export const orcidInputSchema = z
	.string()
	.trim()
	.max(200, 'an ORCID iD is 19 characters; this is far longer')
	.transform((raw, ctx) => {
		if (raw === '') return null;
		const bare = raw.replace(/^(?:https?:\/\/)?(?:www\.)?orcid\.org\//i, '');
		const characters = bare.replace(/[\s-]/g, '').toUpperCase();
		if (!/^\d{15}[\dX]$/.test(characters)) {
			ctx.addIssue({
				code: 'custom',
				message: `an ORCID iD is sixteen characters in four groups of four (digits; the last may be X), e.g. ${EXAMPLE}`
			});
			return z.NEVER;
		}
		const id = characters.match(/.{4}/g)?.join('-') ?? characters;
		if (!isValidOrcid(id)) {
			ctx.addIssue({
				code: 'custom',
				message: `${id} is not an ORCID iD: its last character should be ${orcidCheckCharacter(characters.slice(0, 15))} (check for a typing error)`
			});
			return z.NEVER;
		}
		return id;
	});

/** The /account form that sets (or, left empty, removes) the person's ORCID iD. */
export const orcidForm = z.object({ orcid: orcidInputSchema });
