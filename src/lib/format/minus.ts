/* The Unicode minus (U+2212) for negative numbers: the one typographic rule every formatter uses. */

export const MINUS = '\u2212';

/**
 * A number's text with the Unicode minus for every hyphen-minus (sign and exponent); a value
 * that rounds to zero has no sign.
 */
export function withMinus(text: string): string {
	return /^-0?\.?0*$/.test(text) ? text.slice(1) : text.replace(/-/g, MINUS);
}

/**
 * Running text with a hyphen-minus before a number ("-250 mV", "(-0.4 V)") shown as the Unicode
 * minus; hyphens inside words and ranges ("2Fe-2S", "0-70") are left as typed. For stored
 * messages shown to readers (warnings); display only.
 */
export function unicodeMinusInText(text: string): string {
	return text.replace(/(^|[\s(=≈<>:,;[])-(?=\.?\d)/g, `$1${MINUS}`);
}
