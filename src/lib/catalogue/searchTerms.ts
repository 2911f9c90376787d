import {
	COFACTOR_KIND_LABELS,
	COUPLES_BY_KIND,
	POTENTIAL_METHOD_LABELS,
	type CofactorKind,
	type PotentialMethod
} from '$lib/schemas/vocabulary';

/*
 * The one reading of search text: the indexes are built with it and queries are read with it,
 * so a spelling the trade uses finds what the catalogue holds in another spelling. Pure: no I/O.
 *
 * - Iron–sulfur cluster cores in any of their spellings — "[4Fe-4S]", "4Fe-4S", "4Fe4S",
 *   "Fe4S4", "[Fe4S4]", "2[4Fe-4S]" — become one word ("4fe4s").
 * - Accents, case, superscripts and dashes are folded ("Céline" = "celine", "²⁺" = "2+",
 *   "−" = "-").
 * - Synonyms become one word: haem = heme, UQ/CoQ = ubiquinone, MK = menaquinone,
 *   PQ = plastoquinone, copper = Cu, sulphur = sulfur.
 * - Two-word cofactor names are one word as well as their head word: "heme c", "haem c",
 *   "heme-c" and "c-type heme" give "heme_c" (so "heme c" never finds heme b) beside "heme";
 *   "type-1 Cu", "type 1 copper", "T1 Cu" give "type1_cu" beside "cu".
 * - A query word holding "/" is a couple when both sides end in a charge ("[4Fe-4S]2+/1+",
 *   "4Fe4S 2+/+", "Cu2+/Cu+", "2+/1+") or when it is one of the vocabulary's couples
 *   ("ox/hq", "Q/QH2"): it is matched against the potentials' couples (see `coupleKey`),
 *   not against words.
 * - A DOI ("10.5555/…", "doi:10…", "https://doi.org/10…") is looked up as a whole.
 */

/** Case, accents, superscripts, compatibility forms and dashes folded. */
export function foldText(text: string): string {
	return text
		.normalize('NFKD')
		.replace(/\p{M}/gu, '')
		.replace(/[\u2010-\u2015\u2212\uFE63\uFF0D]/gu, '-')
		.toLowerCase();
}

/** Cluster cores in any spelling to "<n>fe<m>s", spaced so a leading count ("2[4Fe-4S]") stays apart. */
function canonicalClusters(folded: string): string {
	return folded
		.replace(/(?<![a-z])\[?(\d)\s*fe\s*-?\s*(\d)\s*s\]?(?![a-z])/g, ' $1fe$2s ')
		.replace(/(?<![a-z0-9])\[?fe(\d)-?s(\d)\]?(?![a-z0-9])/g, ' $1fe$2s ');
}

/** One word for each synonym (after folding). */
const SYNONYMS: Record<string, string> = {
	haem: 'heme',
	haems: 'heme',
	hemes: 'heme',
	uq: 'ubiquinone',
	coq: 'ubiquinone',
	mk: 'menaquinone',
	pq: 'plastoquinone',
	copper: 'cu',
	sulphur: 'sulfur',
	iron: 'fe'
};

/** Two-word names as one word, followed by their head word (which keeps matching alone). */
function joinPhrases(folded: string): string {
	return folded
		.replace(/\bhaems?\b|\bhemes\b/g, 'heme')
		.replace(/\b([abcdo])\s*-?\s*type\s+heme\b/g, ' heme_$1 heme ')
		.replace(/\bheme\s*-?\s*([abcdo])\b(?:\s*-?\s*type\b)?/g, ' heme_$1 heme ')
		.replace(/\b(?:type\s*-?\s*(?:1|i)|t1)\s*-?\s*(?:cu|copper)\b/g, ' type1_cu cu ')
		.replace(/\bhigh\s*-?\s*potential\s+iron\s*-?\s*sul(?:f|ph)ur\s+proteins?\b/g, ' hipip ');
}

/** The words of a text, as the indexes store them and queries look them up. */
export function searchWords(text: string): string[] {
	const prepared = joinPhrases(canonicalClusters(foldText(text)));
	return prepared
		.split(/[^\p{L}\p{N}_]+/u)
		.filter((w) => w.length > 0)
		.map((w) => SYNONYMS[w] ?? w);
}

/** A couple in comparable form: the whole, and its charge pair when it has one. */
export interface CoupleKey {
	/** E.g. "4fe4s2+/1+", "cu2+/cu1+", "ox/hq". */
	full: string;
	/** E.g. "2+/1+" when both sides end in a charge and share their element (or the right has none). */
	charges: string | null;
	/** The left side without its charge ("4fe4s", "cu", "" for "2+/1+"). */
	prefix: string;
}

const CHARGE = /^(.*?)([+-]\d+|\d*[+-]|0)$/;

function normaliseCharge(charge: string): string {
	if (charge === '0') return '0';
	const sign = charge.includes('+') ? '+' : '-';
	const digits = charge.replace(/[+-]/g, '');
	return `${digits === '' ? '1' : digits}${sign}`;
}

/** The comparable form of a couple as written ("[4Fe-4S]2+/1+", "Fe3+/Fe2+", "ox/hq"), or null. */
export function coupleKey(text: string): CoupleKey | null {
	const compact = canonicalClusters(foldText(text))
		.replace(/[\s[\](){}^]/g, '')
		.replace(/(?<=[a-z0-9])-(?=[a-z])/g, '');
	const sides = compact.split('/');
	if (sides.length !== 2 || sides[0] === '' || sides[1] === '') return null;
	const [left, right] = sides.map((s) => CHARGE.exec(s)) as [
		RegExpExecArray | null,
		RegExpExecArray | null
	];
	if (left && right) {
		const [l, r] = [left, right].map((m) => ({ prefix: m[1]!, charge: normaliseCharge(m[2]!) }));
		const sameElement = r!.prefix === '' || r!.prefix === l!.prefix;
		return {
			full: `${l!.prefix}${l!.charge}/${r!.prefix}${r!.charge}`,
			charges: sameElement ? `${l!.charge}/${r!.charge}` : null,
			prefix: l!.prefix
		};
	}
	return { full: `${sides[0]}/${sides[1]}`, charges: null, prefix: '' };
}

/** Whether a query couple selects a stored one: the same couple, or the same charges when no element was typed. */
export function coupleMatches(query: CoupleKey, stored: CoupleKey): boolean {
	if (query.full === stored.full) return true;
	return query.prefix === '' && query.charges !== null && query.charges === stored.charges;
}

const VOCABULARY_COUPLES = new Set(
	Object.values(COUPLES_BY_KIND)
		.flat()
		.map((c) => coupleKey(c)?.full)
);

const DOI = /^(?:doi:|https?:\/\/(?:dx\.)?doi\.org\/)?(10\.\d{4,9}\/\S+)$/i;

/** One part of a query: every part must match a potential for it to be found. */
export type QueryTerm =
	| { type: 'word'; word: string; prefix: boolean; fuzzy: boolean }
	| { type: 'couple'; couple: CoupleKey; text: string }
	| { type: 'doi'; doi: string };

/**
 * A query read into terms. The last word is a prefix (it may still be being typed); plain
 * alphabetic words of five letters or more forgive one typo; canonical words (cluster cores,
 * joined names) and numbers must match exactly.
 */
export function parseQuery(text: string): QueryTerm[] {
	const terms: QueryTerm[] = [];
	const rest: string[] = [];
	for (const raw of text.trim().split(/\s+/u)) {
		if (raw === '') continue;
		const doi = DOI.exec(raw);
		if (doi) {
			terms.push({ type: 'doi', doi: doi[1]!.toLowerCase() });
			continue;
		}
		if (raw.includes('/')) {
			const couple = coupleKey(raw);
			if (couple && (couple.charges !== null || VOCABULARY_COUPLES.has(couple.full))) {
				terms.push({ type: 'couple', couple, text: raw });
				continue;
			}
		}
		rest.push(raw);
	}
	// The other parts are read together, so that "heme c" is read as one name.
	const words = [...new Set(searchWords(rest.join(' ')))];
	words.forEach((word, i) =>
		terms.push({
			type: 'word',
			word,
			prefix: i === words.length - 1 && !word.includes('_'),
			fuzzy: /^[a-z]{5,}$/.test(word)
		})
	);
	return terms;
}

/** Words a cofactor kind is found by: its label and the trade's other names for it. */
const KIND_EXTRA: Partial<Record<CofactorKind, string>> = {
	fe2s2_ferredoxin: 'plant-type',
	fe4s4_hipip: 'high-potential iron-sulfur protein',
	fmn: 'flavin flavin mononucleotide',
	fad: 'flavin flavin adenine dinucleotide',
	ubiquinone: 'quinone coenzyme Q',
	menaquinone: 'quinone vitamin K2',
	plastoquinone: 'quinone',
	cu_type1: 'blue copper',
	cu_a: 'binuclear copper',
	mo_w_pterin: 'molybdenum tungsten molybdopterin',
	nife: 'nickel-iron',
	fefe: 'iron-iron H-cluster'
};

/** The text a centre of this cofactor kind is indexed under (besides its label and ligation). */
export function cofactorKindText(kind: CofactorKind): string {
	return `${COFACTOR_KIND_LABELS[kind]} ${KIND_EXTRA[kind] ?? ''}`.trim();
}

/** Abbreviations and other names of the methods, beside their labels. */
const METHOD_EXTRA: Record<PotentialMethod, string> = {
	epr_titration: 'EPR',
	optical_titration: 'optical UV-vis absorbance',
	protein_film_voltammetry: 'PFV PFE protein film electrochemistry',
	solution_voltammetry: 'CV cyclic voltammetry electrochemistry',
	spectroelectrochemistry: 'SEC OTTLE',
	mcd_titration: 'MCD magnetic circular dichroism',
	computed: 'calculated DFT'
};

/** The words a potential's method is found by. */
export function methodWords(method: PotentialMethod): string[] {
	return searchWords(`${POTENTIAL_METHOD_LABELS[method]} ${METHOD_EXTRA[method]}`);
}
