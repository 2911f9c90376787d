/*
 * Number formatting for the UI: every number carries its unit, negative numbers carry the
 * Unicode minus (U+2212), and each quantity has one precision rule, here (in the modules this
 * file gathers) and nowhere else:
 *
 * | quantity                         | rule                                             |
 * | -------------------------------- | ------------------------------------------------ |
 * | potential, uncertainty (mV)      | to the mV (`formatMv`; a caller may ask for 0.1) |
 * | distance (Å)                     | to 0.1 Å, always one decimal (`formatAngstrom`)  |
 * | pH                               | to 0.01, at least one decimal (`formatPh`)       |
 * | temperature (K)                  | to 0.01 K, trailing zeros dropped                |
 * | g-value                          | three decimals (`formatGValue`)                  |
 * | energy (eV)                      | three decimals, signed (`formatEv`)              |
 * | rate (s⁻¹), flux                 | three significant figures, × 10ⁿ (`formatRate`)  |
 * | degree of rate control           | two decimals (`formatRateControl`)               |
 * | value as reported                | as typed, up to 4 decimals (`formatReported`)    |
 *
 * Display only: stored values, CSV, the API and citations keep their own numbers.
 *
 * The rules live in four modules under format/ and are re-exported here: the Unicode minus
 * (minus.ts), the quantities of the table (numbers.ts), charges and superscripts (charges.ts) and
 * dates (date.ts). A module is the unit a bundler splits by, so a page that shows only a date, a
 * couple or a warning's text downloads those few lines rather than the whole table. Import from
 * '$lib/format'.
 */

export { MINUS, unicodeMinusInText, withMinus } from './format/minus';
export {
	formatAngstrom,
	formatCelsiusFromKelvin,
	formatEv,
	formatGValue,
	formatGValues,
	formatKelvin,
	formatKelvinValue,
	formatMv,
	formatNumber,
	formatOrderOfMagnitude,
	formatPercent,
	formatPh,
	formatPhValue,
	formatPowerOfTen,
	formatRate,
	formatRateControl,
	formatReported,
	formatReportedValue,
	formatScientific,
	formatSignificant,
	formatSpin,
	formatUncertaintyMv,
	typesetNumbersIn
} from './format/numbers';
export { superscriptInteger, typesetCharges, typesetSegments, typesetText } from './format/charges';
export { formatDate } from './format/date';
