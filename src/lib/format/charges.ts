/* Superscript digits and signs, for charges and for powers of ten (numbers.ts). */

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

/** Digits as superscripts (with the superscript minus), for powers of ten. */
export function superscriptInteger(n: number): string {
	return [...String(n)].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

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
