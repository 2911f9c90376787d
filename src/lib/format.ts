/*
 * Number formatting for the UI: every number carries its unit, negative numbers carry the
 * Unicode minus (U+2212), and each quantity has one precision rule, here and nowhere else:
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
 */

const NBSP = '\u00a0';
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

/** Digits as superscripts (with the superscript minus), for powers of ten. */
export function superscriptInteger(n: number): string {
	return [...String(n)].map((c) => SUPERSCRIPT[c] ?? c).join('');
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

/** A degree of rate control (d ln J / d ln k), two decimals. */
export function formatRateControl(x: number): string {
	return fixed(x, 2);
}

/** A fraction as a percentage: 0.125 → "12.5 %" (two decimals below 1 %). */
export function formatPercent(x: number): string {
	return `${fixed(100 * x, x < 0.01 && x > 0 ? 2 : 1)}${NBSP}%`;
}

export function formatDate(iso: string): string {
	return iso.slice(0, 10);
}

/** Spin S as a fraction where it is one: 0.5 → "1/2". */
export function formatSpin(s: number): string {
	return Number.isInteger(s) ? String(s) : `${Math.round(s * 2)}/2`;
}

const SUPERSCRIPT: Record<string, string> = {
	'0': '⁰',
	'1': '¹',
	'2': '²',
	'3': '³',
	'4': '⁴',
	'5': '⁵',
	'6': '⁶',
	'7': '⁷',
	'8': '⁸',
	'9': '⁹',
	'+': '⁺',
	'-': '⁻',
	'−': '⁻'
};

/*
 * A charge closes a part of a couple: digits then a sign ("2+", "1−", "+"), or a bare "0" where
 * the part is a charge alone or follows a cluster's bracket ("[3Fe-4S]1+/0"). A digit without a
 * sign is a count ("FADH2", "4Fe"), never a charge, so it is left as typed.
 */
const SIGNED_CHARGE = /^(.*?)(\d*[+\-−])$/;
const NEUTRAL_CHARGE = /^((?:.*\])?)(0)$/;

function typesetPart(part: string): string {
	const match = SIGNED_CHARGE.exec(part) ?? NEUTRAL_CHARGE.exec(part);
	if (!match) return part;
	const body = match[1] ?? '';
	const charge = match[2] ?? '';
	if (/\s$/.test(body)) return part;
	return body + [...charge].map((c) => SUPERSCRIPT[c]).join('');
}

/**
 * Charges and oxidation states of a couple or redox state as superscripts, the way the trade
 * prints them: "[4Fe-4S]2+/1+" → "[4Fe-4S]²⁺/¹⁺", "Cu2+/Cu+" → "Cu²⁺/Cu⁺". Display only: stored
 * values, CSV, the API and citations keep the typed text. Show the result inside
 * `whitespace-nowrap` (see Couple.svelte) so that a line never breaks inside a cluster's name.
 */
export function typesetCharges(text: string): string {
	return text
		.split('/')
		.map((part) => typesetPart(part))
		.join('/');
}

/** A token of free text that is a couple or a charged species: "[4Fe-4S]2+/1+", "Cu2+", "2+/1+". */
const CHARGED_TOKEN = /^(?:\S*\/\S*|\[[^\]]+\]\d*[+\-−]|[A-Z][a-z]?\d*[+−]|[A-Z][a-z]?\d+-)$/;

/** Running text cut where its couples and charged species are, each typeset (see `typesetText`). */
export function typesetSegments(text: string): { text: string; typeset: boolean }[] {
	const segments: { text: string; typeset: boolean }[] = [];
	const push = (piece: string, typeset: boolean) => {
		const last = segments.at(-1);
		if (last && !last.typeset && !typeset) last.text += piece;
		else if (piece) segments.push({ text: piece, typeset });
	};
	for (const piece of text.split(/(\S+)/)) {
		if (!piece || /^\s+$/.test(piece)) {
			push(piece, false);
			continue;
		}
		const match = /^(\(?)(.*?)([,.;:)]*)$/.exec(piece);
		const lead = match?.[1] ?? '';
		const body = match?.[2] ?? piece;
		const tail = match?.[3] ?? '';
		if (body && CHARGED_TOKEN.test(body)) {
			push(lead, false);
			push(typesetCharges(body), true);
			push(tail, false);
		} else push(piece, false);
	}
	return segments;
}

/**
 * Charges typeset inside running text, such as an entry's title ("Em of [4Fe-4S]2+/1+, centre
 * C1" → "Em of [4Fe-4S]²⁺/¹⁺, centre C1"): each whitespace-separated token that is a couple or
 * a charged species, without its surrounding punctuation, goes through `typesetCharges`; other
 * words are left as typed. Display only, as `typesetCharges`; TypesetText.svelte shows each
 * typeset token unbroken.
 */
export function typesetText(text: string): string {
	return typesetSegments(text)
		.map((s) => s.text)
		.join('');
}
