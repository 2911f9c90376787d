/*
 * People's names as citation formats want them: family and given parts, or one literal name
 * (an organisation, a consortium) that no format should split or abbreviate.
 */

export type NameParts = { family: string; given: string } | { literal: string };

/**
 * An author of a source as sources store them: "Family, Given" (the part before the first
 * comma is the family name), or a literal name without a comma ("The Demo Consortium").
 */
export function storedAuthorParts(author: string): NameParts {
	const comma = author.indexOf(',');
	if (comma < 0) return { literal: author.trim() };
	const family = author.slice(0, comma).trim();
	const given = author.slice(comma + 1).trim();
	return family ? { family, given } : { literal: author.trim() };
}

/**
 * The name a person gave their account ("Ada Lovelace", "Ludwig van Beethoven", or already
 * "Lovelace, Ada"), split as BibTeX splits "First von Last": the last word is the family name,
 * with the lower-case words just before it ("van", "de la") that are not the first word.
 */
export function displayNameParts(name: string): NameParts {
	const trimmed = name.trim().replace(/\s+/g, ' ');
	if (trimmed.includes(',')) return storedAuthorParts(trimmed);
	const words = trimmed.split(' ');
	if (words.length === 1) return { family: trimmed, given: '' };
	let start = words.length - 1;
	while (start > 1 && /^\p{Ll}/u.test(words[start - 1] as string)) start--;
	return { family: words.slice(start).join(' '), given: words.slice(0, start).join(' ') };
}

/** "Family, G. H." (initials of the given names, hyphenated ones kept), or the literal name. */
export function initialledName(parts: NameParts): string {
	if ('literal' in parts) return parts.literal;
	if (!parts.given) return parts.family;
	const initials = parts.given
		.split(/\s+/)
		.map((word) =>
			word
				.split('-')
				.map((piece) => (piece ? `${[...piece][0]}.` : ''))
				.join('-')
		)
		.join(' ');
	return `${parts.family}, ${initials}`;
}
