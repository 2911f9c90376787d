import { superscriptInteger } from './charges';
import { unicodeMinusInText, withMinus } from './minus';

/*
 * The precision rule of each quantity (the table in ../format.ts). One module, because a page that
 * shows one measured quantity nearly always shows several.
 */

const NBSP = '\u00a0';

/** Rounded to `digits` decimals, trailing zeros dropped. */
function trim(value: number, digits: number): string {
	return withMinus(Number(value.toFixed(digits)).toString());
}

/** Rounded to `digits` decimals, trailing zeros kept. */
function fixed(value: number, digits: number): string {
	return withMinus(value.toFixed(digits));
}

/** A bare number with the Unicode minus, as given (no rounding): for values with no rule here. */
export function formatNumber(value: number): string {
	return withMinus(String(value));
}

export function formatMv(mv: number | null, digits = 0): string {
	return mv === null ? '—' : `${trim(mv, digits)}${NBSP}mV`;
}

/** An uncertainty in mV: "± 10 mV". */
export function formatUncertaintyMv(mv: number | null): string {
	return mv === null ? '—' : `±${NBSP}${formatMv(mv)}`;
}

export function formatKelvin(k: number | null): string {
	return k === null ? '—' : `${formatKelvinValue(k)}${NBSP}K`;
}

/** A temperature in K without its unit, for a column whose header names it: "298.15". */
export function formatKelvinValue(k: number): string {
	return trim(k, 2);
}

/** Temperature in °C from kelvin, to 0.01 °C ("25 °C"). */
export function formatCelsiusFromKelvin(k: number | null): string {
	return k === null ? '—' : `${trim(k - 273.15, 2)}${NBSP}°C`;
}

export function formatAngstrom(a: number | null): string {
	return a === null ? '—' : `${fixed(a, 1)}${NBSP}Å`;
}

/** pH to 0.01 with at least one decimal: 7 → "7.0", 7.25 → "7.25". */
export function formatPhValue(ph: number): string {
	const text = trim(ph, 2);
	return text.includes('.') ? text : `${text}.0`;
}

export function formatPh(ph: number | null): string {
	return ph === null ? '—' : `pH${NBSP}${formatPhValue(ph)}`;
}

export function formatReported(value: number, unit: string, electrodeLabel: string): string {
	return `${trim(value, 4)}${NBSP}${unit} vs ${electrodeLabel}`;
}

/** A value as reported, without its unit: as typed, up to 4 decimals. */
export function formatReportedValue(value: number): string {
	return trim(value, 4);
}

/** One g-value, three decimals. */
export function formatGValue(g: number): string {
	return fixed(g, 3);
}

export function formatGValues(gs: readonly number[]): string {
	return gs.length === 0 ? '—' : gs.map(formatGValue).join(', ');
}

/** An energy in eV, three decimals, signed with the Unicode minus. */
export function formatEv(ev: number): string {
	return `${fixed(ev, 3)}${NBSP}eV`;
}

/** A degree of rate control (d ln J / d ln k), two decimals. */
export function formatRateControl(x: number): string {
	return fixed(x, 2);
}

/** A fraction as a percentage: 0.125 → "12.5 %" (two decimals below 1 %). */
export function formatPercent(x: number): string {
	return `${fixed(100 * x, x < 0.01 && x > 0 ? 2 : 1)}${NBSP}%`;
}

/** Spin S as a fraction where it is one: 0.5 → "1/2". */
export function formatSpin(s: number): string {
	return Number.isInteger(s) ? String(s) : `${Math.round(s * 2)}/2`;
}

/* Quantities that span orders of magnitude (rates, fluxes, calculator results): powers of ten. */

/**
 * Notes written by the science modules, for readers: numbers in a programming language's
 * notation ("1.2e-9") in powers of ten ("1.2 × 10⁻⁹"), and minus signs as in
 * `unicodeMinusInText`.
 */
export function typesetNumbersIn(text: string): string {
	return unicodeMinusInText(
		text.replace(
			/(\d(?:\.\d+)?)e([-+]?\d+)/g,
			(_, m: string, e: string) => `${m} × 10${superscriptInteger(Number(e))}`
		)
	);
}

/**
 * A positive quantity in scientific notation, three significant figures: 12345 → "1.23 × 10⁴";
 * between 0.01 and 1000 as a plain number ("42.0", "0.125").
 */
export function formatScientific(x: number): string {
	if (!Number.isFinite(x)) return '—';
	if (x === 0) return '0';
	const abs = Math.abs(x);
	if (abs >= 0.01 && abs < 1000) return withMinus(x.toPrecision(3));
	const [mantissa = '', exponent = '0'] = x.toExponential(2).split('e');
	return `${withMinus(mantissa)}${NBSP}×${NBSP}10${superscriptInteger(Number(exponent))}`;
}

/**
 * A calculator's result: `significant` figures, in powers of ten ("1.23 × 10⁻⁵") below 0.001
 * and from a million up, plain digits between.
 */
export function formatSignificant(value: number, significant = 4): string {
	const abs = Math.abs(value);
	if (value !== 0 && (abs < 1e-3 || abs >= 1e6)) {
		const [mantissa = '', exponent = '0'] = value.toExponential(significant - 1).split('e');
		return withMinus(`${Number(mantissa)} × 10${superscriptInteger(Number(exponent))}`);
	}
	return withMinus(String(Number(value.toPrecision(significant))));
}

/** Always in powers of ten with `significant` figures: "4.14 × 10⁷", "2.9 × 10⁻⁴". */
export function formatPowerOfTen(value: number, significant = 3): string {
	if (value === 0) return '0';
	const [mantissa = '', exponent = '0'] = value.toExponential(significant - 1).split('e');
	return withMinus(`${mantissa} × 10${superscriptInteger(Number(exponent))}`);
}

/** A value rounded to one significant figure, as an order of magnitude: "≈ 8 × 10³", "≈ 3". */
export function formatOrderOfMagnitude(value: number): string {
	const rounded = Number(value.toPrecision(1));
	if (Math.abs(rounded) < 10) return `≈ ${formatSignificant(rounded, 1)}`;
	const exponent = Math.floor(Math.log10(Math.abs(rounded)));
	return withMinus(`≈ ${Math.round(rounded / 10 ** exponent)} × 10${superscriptInteger(exponent)}`);
}

/**
 * A rate in s⁻¹ (three significant figures); a rate that underflows to zero is given by its
 * power of ten, from its base-10 logarithm when one is known: "< 10⁻³⁰⁰ (about 10⁻⁴¹²)".
 */
export function formatRate(perS: number, log10?: number): string {
	if (perS > 0) return `${formatScientific(perS)}${NBSP}s⁻¹`;
	const about =
		log10 !== undefined && Number.isFinite(log10)
			? ` (about 10${superscriptInteger(Math.round(log10))})`
			: '';
	return `<${NBSP}10${superscriptInteger(-300)}${NBSP}s⁻¹${about}`;
}
