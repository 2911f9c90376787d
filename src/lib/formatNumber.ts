/*
 * Numbers computed by the calculators, as the pages show them: a true minus sign (U+2212), and
 * powers of ten typeset ("1.23 × 10⁻⁵") rather than in a programming language's notation
 * ("1.23e-5"). Display only: the API and the values filled into fields for the server keep the
 * number, and every field reads a typeset minus back (readDecimal).
 */

const SUPERSCRIPT: Record<string, string> = {
	'-': '⁻',
	'0': '⁰',
	'1': '¹',
	'2': '²',
	'3': '³',
	'4': '⁴',
	'5': '⁵',
	'6': '⁶',
	'7': '⁷',
	'8': '⁸',
	'9': '⁹'
};

/** Every hyphen-minus of a number's text as a true minus sign. */
export const withMinus = (text: string): string => text.replace(/-/g, '−');

/** A number as JavaScript writes it in full, with a true minus sign: −0.1, 12.5. */
export function formatNumberText(value: number): string {
	return withMinus(String(value));
}

/** "1.23 × 10⁻⁵" for very small or large numbers, plain digits otherwise; a true minus sign. */
export function formatNumber(value: number, significant = 4): string {
	const abs = Math.abs(value);
	if (value !== 0 && (abs < 1e-3 || abs >= 1e6)) {
		const [mantissa, exponent] = value.toExponential(significant - 1).split('e') as [
			string,
			string
		];
		const power = String(Number(exponent)).replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
		return withMinus(`${Number(mantissa)} × 10${power}`);
	}
	return withMinus(String(Number(value.toPrecision(significant))));
}

/** Always in powers of ten with `significant` figures: "4.14 × 10⁷", "2.9 × 10⁻⁴". */
export function formatPowerOfTen(value: number, significant = 3): string {
	if (value === 0) return '0';
	const [mantissa, exponent] = value.toExponential(significant - 1).split('e') as [string, string];
	const power = String(Number(exponent)).replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
	return withMinus(`${mantissa} × 10${power}`);
}

/** A value rounded to one significant figure, as an order of magnitude: "≈ 8 × 10³", "≈ 3". */
export function formatOrderOfMagnitude(value: number): string {
	const rounded = Number(value.toPrecision(1));
	if (Math.abs(rounded) < 10) return `≈ ${formatNumber(rounded, 1)}`;
	const exponent = Math.floor(Math.log10(Math.abs(rounded)));
	const power = String(exponent).replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
	return withMinus(`≈ ${Math.round(rounded / 10 ** exponent)} × 10${power}`);
}

/** Numbers written as 1.2e-9 or -0.5 inside a text (notes from the science), typeset. */
export function typesetNumbersIn(text: string): string {
	return text
		.replace(
			/(\d(?:\.\d+)?)e([-+]?\d+)/g,
			(_, m: string, e: string) =>
				`${m} × 10${String(Number(e)).replace(/./g, (c) => SUPERSCRIPT[c] ?? c)}`
		)
		.replace(/(^|[\s(=,;:[])-(?=\.?\d)/g, '$1−');
}
