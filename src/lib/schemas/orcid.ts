import { z } from 'zod';
import { isValidOrcid, orcidCheckCharacter } from './orcidId';

/*
 * What a person types as their ORCID iD on /account. The form of an iD, its check character and
 * its URL are in orcidId.ts (the pages that show an iD need those alone).
 */

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
