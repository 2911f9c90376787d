/*
 * One reading of a typed number for every numeric field: forms, calculators, query strings.
 *
 * The trade writes numbers several ways — a Unicode minus (U+2212) pasted from a paper, a figure
 * dash, a decimal comma, a thin space between digit groups — and all of them mean the same value.
 * What JavaScript's Number() would also accept but nobody means in a measurement is refused:
 * hexadecimal ("0x10" is not 16 Å), binary and octal prefixes, "Infinity", and the empty string
 * (Number('') is 0).
 */

const MINUS_SIGNS = /[\u2212\u2012\u2013\uFE63\uFF0D]/g;
/** Spaces people put between digit groups: ordinary, no-break, thin, narrow no-break. */
const GROUP_SPACES = /[\s\u00A0\u2009\u202F]+/g;
const PLAIN_DECIMAL = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
/**
 * "1,000" could be one thousand or one: refused rather than guessed. A leading zero is never a
 * digit group, so "0,980" (a signal written with a decimal comma) is 0.98.
 */
const AMBIGUOUS_COMMA = /^[-+]?[1-9]\d{0,2},\d{3}$/;

export interface DecimalOptions {
	/** Read "1,5" as 1.5 (default true). CSV files with comma separators turn this off. */
	decimalComma?: boolean;
}

/** The value of a typed decimal number, or null when the text is not one. */
export function readDecimal(text: string, options: DecimalOptions = {}): number | null {
	let normalised = text.trim().replace(MINUS_SIGNS, '-').replace(GROUP_SPACES, '');
	if ((options.decimalComma ?? true) && normalised.includes(',') && !normalised.includes('.')) {
		if (AMBIGUOUS_COMMA.test(normalised)) return null;
		if (/^[^,]*,[^,]*$/.test(normalised)) normalised = normalised.replace(',', '.');
	}
	if (!PLAIN_DECIMAL.test(normalised)) return null;
	const value = Number(normalised);
	return Number.isFinite(value) ? value : null;
}

/** The message every numeric field gives for text that is not a number. */
export const NOT_A_DECIMAL =
	'expected a plain decimal number (a minus sign, a decimal point or comma, digits; e.g. −0.42)';
