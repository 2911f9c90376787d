/*
 * Text for BibTeX files that pdflatex typesets without stopping, whatever the document's font
 * encoding (OT1, LaTeX's default, or T1) and without extra packages: every character written is
 * ASCII. LaTeX's own specials are escaped. Greek letters, sub- and superscripts, dashes, quotes
 * and common symbols become commands of the LaTeX kernel: text commands such as \textpm and
 * \textdegree where the kernel has one (citation-js reads those back too), math mode otherwise.
 * Accented Latin letters become accent commands over their base letter (from the Unicode
 * canonical decomposition; "Å" is \r{A}, which is what \AA draws). A character none of this
 * covers (a Chinese or Arabic name, say) becomes "?": a clean fallback rather than an "Unicode
 * character … not set up for use with LaTeX" error. CSL-JSON and RIS keep the text as it is.
 */

const GREEK_LOWER = [
	'alpha',
	'beta',
	'gamma',
	'delta',
	'epsilon',
	'zeta',
	'eta',
	'theta',
	'iota',
	'kappa',
	'lambda',
	'mu',
	'nu',
	'xi',
	'o',
	'pi',
	'rho',
	'varsigma',
	'sigma',
	'tau',
	'upsilon',
	'phi',
	'chi',
	'psi',
	'omega'
];
// Capitals that look like Latin letters have no command of their own in LaTeX.
const GREEK_UPPER = [
	'A',
	'B',
	'\\Gamma',
	'\\Delta',
	'E',
	'Z',
	'H',
	'\\Theta',
	'I',
	'K',
	'\\Lambda',
	'M',
	'N',
	'\\Xi',
	'O',
	'\\Pi',
	'P',
	'',
	'\\Sigma',
	'T',
	'\\Upsilon',
	'\\Phi',
	'X',
	'\\Psi',
	'\\Omega'
];

/** Single characters and the LaTeX that stands for them. */
const SYMBOLS: Record<string, string> = {
	'\\': '\\textbackslash{}',
	// \{ would leave BibTeX counting an unbalanced brace.
	'{': '\\textbraceleft{}',
	'}': '\\textbraceright{}',
	'%': '\\%',
	'&': '\\&',
	'#': '\\#',
	_: '\\_',
	$: '\\$',
	'~': '\\textasciitilde{}',
	'^': '\\textasciicircum{}',
	// In OT1 these slots hold ¡, ¿ and an em dash.
	'<': '\\textless{}',
	'>': '\\textgreater{}',
	'|': '\\textbar{}',
	'\u00a0': '~',
	'\u2009': ' ',
	'\u202f': ' ',
	'\u2013': '--',
	'\u2014': '---',
	'\u2010': '-',
	'\u2011': '-',
	'\u2212': '\\textminus{}',
	'\u2018': '`',
	'\u2019': "'",
	'\u201c': '``',
	'\u201d': "''",
	'\u2026': '\\textellipsis{}',
	'\u00b7': '\\textperiodcentered{}',
	'\u22c5': '\\textperiodcentered{}',
	'\u00d7': '\\texttimes{}',
	'\u00b1': '\\textpm{}',
	'\u2213': '$\\mp$',
	'\u00b0': '\\textdegree{}',
	'\u2032': "$'$",
	'\u2033': "$''$",
	'\u2192': '\\textrightarrow{}',
	'\u2190': '\\textleftarrow{}',
	'\u2194': '$\\leftrightarrow$',
	'\u21cc': '$\\rightleftharpoons$',
	'\u2264': '$\\leq$',
	'\u2265': '$\\geq$',
	'\u2248': '$\\approx$',
	'\u223c': '$\\sim$',
	'\u221e': '$\\infty$',
	'\u00b5': '\\textmu{}',
	'\u00df': '{\\ss}',
	'\u00e6': '{\\ae}',
	'\u00c6': '{\\AE}',
	'\u0153': '{\\oe}',
	'\u0152': '{\\OE}',
	'\u00f8': '{\\o}',
	'\u00d8': '{\\O}',
	'\u0142': '{\\l}',
	'\u0141': '{\\L}',
	'\u0131': '{\\i}',
	'\u00a7': '{\\S}',
	'\u00b6': '{\\P}',
	'\u00a9': '\\textcopyright{}',
	'\u2044': '/',
	'\u03c2': '$\\varsigma$',
	'\u03d1': '$\\vartheta$',
	'\u03d5': '$\\phi$',
	'\u03c6': '$\\varphi$',
	'\u03f5': '$\\epsilon$',
	'\u03b5': '$\\varepsilon$'
};
for (const [i, name] of GREEK_LOWER.entries()) {
	const ch = String.fromCodePoint(0x03b1 + i);
	SYMBOLS[ch] ??= name === 'o' ? 'o' : `$\\${name}$`;
}
for (const [i, command] of GREEK_UPPER.entries()) {
	if (command)
		SYMBOLS[String.fromCodePoint(0x0391 + i)] = command.startsWith('\\') ? `$${command}$` : command;
}

const SUPERSCRIPTS: Record<string, string> = {
	'\u2070': '0',
	'\u00b9': '1',
	'\u00b2': '2',
	'\u00b3': '3',
	'\u2074': '4',
	'\u2075': '5',
	'\u2076': '6',
	'\u2077': '7',
	'\u2078': '8',
	'\u2079': '9',
	'\u207a': '+',
	'\u207b': '-',
	'\u207c': '=',
	'\u207d': '(',
	'\u207e': ')',
	'\u207f': 'n',
	'\u2071': 'i'
};
const SUBSCRIPTS: Record<string, string> = {
	'\u2080': '0',
	'\u2081': '1',
	'\u2082': '2',
	'\u2083': '3',
	'\u2084': '4',
	'\u2085': '5',
	'\u2086': '6',
	'\u2087': '7',
	'\u2088': '8',
	'\u2089': '9',
	'\u208a': '+',
	'\u208b': '-',
	'\u208c': '=',
	'\u208d': '(',
	'\u208e': ')'
};

/** Combining marks and the accent commands OT1 and T1 both have. */
const ACCENTS: Record<string, string> = {
	'\u0300': '`',
	'\u0301': "'",
	'\u0302': '^',
	'\u0303': '~',
	'\u0304': '=',
	'\u0306': 'u',
	'\u0307': '.',
	'\u0308': '"',
	'\u030a': 'r',
	'\u030b': 'H',
	'\u030c': 'v',
	'\u0323': 'd',
	'\u0327': 'c',
	'\u0331': 'b'
};

const BELOW = new Set(['\u0323', '\u0327', '\u0331']);

const COMBINING = /[\u0300-\u036f]/;

/** One letter with its combining marks, e.g. "e\u0301" → "{\'{e}}"; unknown marks are dropped. */
function accented(base: string, marks: string[]): string {
	// A dotless i or j under accents above the letter; accents below keep the dot.
	const above = marks.some((m) => !BELOW.has(m));
	let out = above && base === 'i' ? '\\i' : above && base === 'j' ? '\\j' : base;
	for (const mark of marks) {
		const command = ACCENTS[mark];
		if (command) out = `\\${command}{${out}}`;
	}
	return out === base ? base : `{${out}}`;
}

/**
 * A character outside ASCII that no table covers: its compatibility form ("ﬁ" → "fi",
 * "½" → "1/2") where every part of that is covered, or "?".
 */
function fallback(ch: string): string {
	const parts = [...ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '')];
	if (parts.length === 0 || parts.join('') === ch) return '?';
	const written = parts.map((p) => (/[\x20-\x7e]/.test(p) ? latexAscii(p) : SYMBOLS[p]));
	return written.every((w) => w !== undefined) ? written.join('') : '?';
}

function isControl(ch: string): boolean {
	const code = ch.codePointAt(0) ?? 0;
	return code < 0x20 || code === 0x7f;
}

function latexAscii(text: string): string {
	return text.replace(/[\\{}%&#_$~^<>|]/g, (ch) => SYMBOLS[ch] ?? ch);
}

/**
 * Text as LaTeX in ASCII, for BibTeX fields that are typeset (titles, names, journals, notes).
 * Not for URLs (`\url` and the `url` field take them as they are).
 */
export function toLatex(text: string): string {
	if (/^[\x20-\x7e]*$/.test(text)) return latexAscii(text);
	// Decomposed, so that an accented letter arrives as its base letter and combining marks.
	const chars = [...text.normalize('NFD')];
	let out = '';
	for (let i = 0; i < chars.length; i++) {
		const ch = chars[i] as string;
		if (SUPERSCRIPTS[ch] !== undefined || SUBSCRIPTS[ch] !== undefined) {
			const table = SUPERSCRIPTS[ch] !== undefined ? SUPERSCRIPTS : SUBSCRIPTS;
			let run = '';
			while (i < chars.length && table[chars[i] as string] !== undefined) {
				run += table[chars[i] as string];
				i++;
			}
			i--;
			out += `\\text${table === SUPERSCRIPTS ? 'super' : 'sub'}script{${run}}`;
			continue;
		}
		const marks: string[] = [];
		while (i + 1 < chars.length && COMBINING.test(chars[i + 1] as string)) {
			marks.push(chars[i + 1] as string);
			i++;
		}
		if (/[A-Za-z]/.test(ch) && marks.length > 0) out += accented(ch, marks);
		else if (SYMBOLS[ch] !== undefined) out += SYMBOLS[ch];
		else if (/[\x20-\x7e]/.test(ch)) out += ch;
		else if (isControl(ch)) out += /[\t\r\n\f\v]/.test(ch) ? ' ' : '';
		else if (!COMBINING.test(ch)) out += fallback(ch);
	}
	return out;
}
