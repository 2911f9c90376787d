/* Number formatting for the UI: every number carries its unit. */

const NBSP = '\u00a0';

function trim(value: number, digits: number): string {
	return Number(value.toFixed(digits)).toString().replace('-', '−');
}

export function formatMv(mv: number | null, digits = 0): string {
	return mv === null ? '—' : `${trim(mv, digits)}${NBSP}mV`;
}

export function formatKelvin(k: number | null): string {
	return k === null ? '—' : `${trim(k, 2)}${NBSP}K`;
}

export function formatAngstrom(a: number | null): string {
	return a === null ? '—' : `${trim(a, 1)}${NBSP}Å`;
}

export function formatPh(ph: number | null): string {
	return ph === null ? '—' : `pH${NBSP}${trim(ph, 2)}`;
}

export function formatReported(value: number, unit: string, electrodeLabel: string): string {
	return `${trim(value, 4)}${NBSP}${unit} vs ${electrodeLabel}`;
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
