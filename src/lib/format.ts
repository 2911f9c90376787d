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
