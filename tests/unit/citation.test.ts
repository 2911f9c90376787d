import fc from 'fast-check';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { fillAccessDate, localCalendarDate } from '$lib/catalogue/accessDate';
import {
	citeRecord,
	cslItems,
	doiUrl,
	originalKey,
	pageCitation,
	plainCitations
} from '$lib/catalogue/citation';
import { toLatex } from '$lib/catalogue/latex';
import { displayNameParts, initialledName, storedAuthorParts } from '$lib/catalogue/personName';
import { POTENTIAL } from '../support/citations';

/** Field values of one BibTeX entry (flat; enough for the entries written here). */
function bibFields(bibtex: string, key: string): Record<string, string> {
	const start = bibtex.indexOf(`{${key},`);
	const end = bibtex.indexOf('\n}', start);
	const fields: Record<string, string> = {};
	for (const line of bibtex.slice(start, end).split('\n').slice(1)) {
		const m = /^ {2}(\w+) = \{(.*)\},?$/.exec(line);
		if (m) fields[m[1] as string] = m[2] as string;
	}
	return fields;
}

describe('BibTeX', () => {
	const c = citeRecord(POTENTIAL, '2026-12-02');
	const record = bibFields(c.bibtex, 'hopline_HL000046_v2');

	it('is one @misc entry for the record and one @article for the paper', () => {
		expect(c.bibtex).toMatch(/^@misc\{hopline_HL000046_v2,\n/);
		expect(c.bibtex).toContain('\n@article{Muller2020_HL000003,\n');
		expect(c.bibtex).toContain('% Cite the original measurement too');
	});
	it('protects the title from a style lower-casing it, and keeps accession and version out of it', () => {
		// plain.bst and its kin lower-case every title letter outside braces ("[4fe-4s]", "roxa").
		expect(record.title).toBe(
			'{Em of [4Fe-4S]2+/1+ of FS1 in RoxA--H \\& NADH\\_site (50\\% reduced)}'
		);
		expect(record.title).not.toContain('HL000046');
		expect(record.version).toBe('2');
	});
	it('puts the permalink where classic styles print it, as well as in url', () => {
		expect(record.howpublished).toBe(
			'Hopline record HL000046, version 2, \\url{https://hopline.example/e/HL000046/v2}'
		);
		expect(record.url).toBe('https://hopline.example/e/HL000046/v2');
	});
	it('names contributors as authors, the curator as editor, and ORCID iDs', () => {
		expect(record.author).toBe('Lovelace, Ada and van Beethoven, Ludwig');
		expect(record.editor).toBe('Curator, Carl');
		expect(record.note).toContain('Ada Lovelace \\url{https://orcid.org/0000-0002-1825-0097}');
	});
	it('keeps the access date in urldate and note when the reader gave it', () => {
		expect(record.urldate).toBe('2026-12-02');
		expect(record.note).toMatch(/^Accessed 2026-12-02\. /);
	});
	it('writes the paper in ASCII LaTeX with its DOI', () => {
		const paper = bibFields(c.bibtex, 'Muller2020_HL000003');
		expect(paper.author).toBe('M{\\"{u}}ller, J{\\"{u}}rgen and Nguy{\\~{\\^{e}}}n, Th{\\d{i}}');
		expect(paper.title).toBe(
			'{Redox titration of $\\alpha$-subunit Fe\\textsubscript{4}S\\textsubscript{4}\\textsuperscript{2+} clusters at 25 \\textdegree{}C}'
		);
		expect(paper.doi).toBe('10.5555/demo_1');
		expect(paper.url).toBe('https://doi.org/10.5555/demo_1');
		expect(c.bibtex).toMatch(/^[\x20-\x7e\n]*$/);
	});
	it('cites the registry when nobody is credited by name', () => {
		const bib = citeRecord({ ...POTENTIAL, authors: [], editors: [] }, null).bibtex;
		expect(bibFields(bib, 'hopline_HL000046_v2').author).toBe('{Hopline contributors}');
		expect(bib).not.toContain('editor =');
	});
	it('keeps a family name holding "and" whole', () => {
		const bib = citeRecord({ ...POTENTIAL, authors: [{ name: 'Ann and', orcid: null }] }, null);
		expect(bibFields(bib.bibtex, 'hopline_HL000046_v2').author).toBe('{and}, Ann');
	});
});

describe('RIS', () => {
	const c = citeRecord(POTENTIAL, '2026-12-02');
	const records = c.ris.split('ER  - \r\n').filter(Boolean);
	// RIS tags per the RIS format specification (Research Information Systems): TY first, ER last.
	it('holds two records, each from TY to ER, in CRLF lines', () => {
		expect(c.ris.match(/^TY {2}- /gm)).toHaveLength(2);
		expect(c.ris.match(/^ER {2}- $/gm)).toHaveLength(2);
		expect(c.ris.replaceAll('\r\n', '')).not.toContain('\n');
		expect(c.ris.split('\r\n')[0]).toBe('TY  - DATA');
	});
	it('gives the record its accession and version in their own tags', () => {
		const lines = (records[0] as string).split('\r\n');
		expect(lines).toContain('AN  - HL000046');
		expect(lines).toContain('ET  - 2');
		expect(lines).toContain('TI  - Em of [4Fe-4S]2+/1+ of FS1 in RoxA–H & NADH_site (50% reduced)');
		expect(lines).toContain('AU  - Lovelace, Ada');
		expect(lines).toContain('A2  - Curator, Carl');
		expect(lines).toContain('Y2  - 2026/12/02');
	});
	it('gives the paper its DOI', () => {
		const lines = (records[1] as string).split('\r\n');
		expect(lines[0]).toBe('TY  - JOUR');
		expect(lines).toContain('DO  - 10.5555/demo_1');
		expect(lines).toContain('AU  - Nguyễn, Thị');
	});
});

describe('CSL-JSON', () => {
	// CSL-JSON schema (citation-style-language/schema, csl-data.json): type, names, date-parts.
	it('is the record (a dataset) and the paper (an article)', () => {
		const [record, paper] = JSON.parse(citeRecord(POTENTIAL, '2026-12-02').cslJson);
		expect(record).toMatchObject({
			id: 'hopline_HL000046_v2',
			type: 'dataset',
			version: '2',
			number: 'HL000046',
			URL: POTENTIAL.permalink,
			issued: { 'date-parts': [[2024, 3, 11]] },
			accessed: { 'date-parts': [[2026, 12, 2]] },
			editor: [{ family: 'Curator', given: 'Carl' }]
		});
		expect(record.author[0]).toEqual({
			family: 'Lovelace',
			given: 'Ada',
			ORCID: 'https://orcid.org/0000-0002-1825-0097'
		});
		expect(paper).toMatchObject({
			type: 'article-journal',
			DOI: '10.5555/demo_1',
			'container-title': 'J. Demo Biochem.',
			issued: { 'date-parts': [[2020]] }
		});
	});
	it('a source entry carries the publication itself', () => {
		const items = cslItems({ ...POTENTIAL, kind: 'source' }, null);
		expect(items[1]?.note).toContain('Cite the publication itself');
	});
});

describe('the access date', () => {
	afterEach(() => vi.useRealTimers());

	it('is named only when given, and nothing else depends on the day', () => {
		vi.useFakeTimers();
		vi.setSystemTime(new Date('2026-01-01T12:00:00Z'));
		const first = citeRecord(POTENTIAL, null);
		vi.setSystemTime(new Date('2031-07-15T23:59:00Z'));
		expect(citeRecord(POTENTIAL, null)).toEqual(first);
		for (const text of Object.values(first)) {
			expect(text).not.toMatch(/accessed|urldate|Y2 {2}-/i);
		}
	});
	it('is the local calendar date, not the UTC one', () => {
		// 23:30 local on 1 December, whatever the machine's zone: the local fields decide.
		const late = new Date(2026, 11, 1, 23, 30);
		expect(localCalendarDate(late)).toBe('2026-12-01');
	});
});

describe('an entry page’s citation, with holes for the reader’s date', () => {
	const page = pageCitation(POTENTIAL);
	it('fills to the bytes of each file for that date', () => {
		for (const date of ['2026-12-02', '2031-01-09']) {
			const files = citeRecord(POTENTIAL, date);
			expect(page.files.map((f) => [f.extension, fillAccessDate(f.text, date)])).toEqual([
				['bib', files.bibtex],
				['ris', files.ris],
				['json', files.cslJson]
			]);
			expect(fillAccessDate(page.datedRecord, date)).toBe(plainCitations(POTENTIAL, date).record);
		}
	});
	it('names no date until the page fills one in', () => {
		expect(page.plain).toEqual(plainCitations(POTENTIAL, null));
		expect(page.files.map((f) => f.path)).toEqual([
			'/e/HL000046/v2/cite.bib',
			'/e/HL000046/v2/cite.ris',
			'/e/HL000046/v2/cite.json'
		]);
	});
	it('marks its holes with a character the record does not hold', () => {
		// U+E000 is the first mark tried: a title holding it must come through as it is.
		const record = { ...POTENTIAL, title: 'Odd \uE000iso\uE000 title', original: null };
		const text = fillAccessDate(pageCitation(record).datedRecord, '2026-12-02');
		expect(text).toContain('Odd \uE000iso\uE000 title');
		expect(text).toMatch(/\(accessed 2026-12-02\)$/);
	});
});

describe('plain text', () => {
	it('reads as a reference, then the paper', () => {
		const [record, paper] = citeRecord(POTENTIAL, '2026-12-02').text.split('\n');
		expect(record).toBe(
			'Lovelace, A., & van Beethoven, L. (2024). Em of [4Fe-4S]2+/1+ of FS1 in RoxA–H & NADH_site (50% reduced) (Hopline record HL000046, version 2) [Data set]. Hopline. https://hopline.example/e/HL000046/v2 (accessed 2026-12-02)'
		);
		expect(paper).toBe(
			'Cite the original measurement: Müller, J., & Nguyễn, T. (2020). Redox titration of α-subunit Fe₄S₄²⁺ clusters at 25 °C. J. Demo Biochem. https://doi.org/10.5555/demo_1'
		);
	});
});

describe('LaTeX text', () => {
	it.each([
		['Em of [4Fe-4S]2+/1+ in RoxA–H', 'Em of [4Fe-4S]2+/1+ in RoxA--H'],
		['α-helix, β-sheet, Δ, Ω', '$\\alpha$-helix, $\\beta$-sheet, $\\Delta$, $\\Omega$'],
		['Fe₂S₂²⁺', 'Fe\\textsubscript{2}S\\textsubscript{2}\\textsuperscript{2+}'],
		[
			'5 Å, 25 °C, ± 3 µM, a → b',
			'5 {\\r{A}}, 25 \\textdegree{}C, \\textpm{} 3 \\textmu{}M, a \\textrightarrow{} b'
		],
		['Müller, Ångström, Gödel', 'M{\\"{u}}ller, {\\r{A}}ngstr{\\"{o}}m, G{\\"{o}}del'],
		['Nguyễn Thị, Çelik, Łukasz', 'Nguy{\\~{\\^{e}}}n Th{\\d{i}}, {\\c{C}}elik, {\\L}ukasz'],
		[
			'{a} \\ 50% & #1 $x_1 ~^',
			'\\textbraceleft{}a\\textbraceright{} \\textbackslash{} 50\\% \\& \\#1 \\$x\\_1 \\textasciitilde{}\\textasciicircum{}'
		],
		['a < b > c | d', 'a \\textless{} b \\textgreater{} c \\textbar{} d'],
		['ﬁne ½', 'fine 1/2'],
		['李 (Li)', '? (Li)'],
		['tab\tbell\u0007', 'tab bell']
	])('%j → %j', (text, latex) => expect(toLatex(text)).toBe(latex));

	it('is printable ASCII with balanced braces, whatever the text', () => {
		// What keeps BibTeX reading the field and pdflatex running (see texToolchain.test.ts).
		fc.assert(
			fc.property(fc.string({ unit: 'grapheme', maxLength: 60 }), (text) => {
				const latex = toLatex(text);
				expect(latex).toMatch(/^[\x20-\x7e]*$/);
				let depth = 0;
				for (const ch of latex) {
					depth += ch === '{' ? 1 : ch === '}' ? -1 : 0;
					expect(depth).toBeGreaterThanOrEqual(0);
				}
				expect(depth).toBe(0);
			}),
			{ numRuns: 500 }
		);
	});
});

describe('names', () => {
	it.each([
		['Ada Lovelace', { family: 'Lovelace', given: 'Ada' }],
		['Ludwig van Beethoven', { family: 'van Beethoven', given: 'Ludwig' }],
		['Lovelace, Ada', { family: 'Lovelace', given: 'Ada' }],
		['Plato', { family: 'Plato', given: '' }],
		['  Ada   Augusta  King ', { family: 'King', given: 'Ada Augusta' }]
	])('an account name %j splits as BibTeX does', (name, parts) =>
		expect(displayNameParts(name)).toEqual(parts)
	);
	it('a stored author without a comma is a literal name', () => {
		expect(storedAuthorParts('The Demo Consortium')).toEqual({ literal: 'The Demo Consortium' });
		expect(storedAuthorParts('Müller, Jürgen')).toEqual({ family: 'Müller', given: 'Jürgen' });
	});
	it('initials keep hyphenated given names', () =>
		expect(initialledName({ family: 'Curie', given: 'Marie-Anne Sophie' })).toBe(
			'Curie, M.-A. S.'
		));
	it('citation keys use the ASCII letters of the first family name', () => {
		expect(originalKey(['Müller, Jürgen'], 2020, 'HL000003')).toBe('Muller2020_HL000003');
		expect(originalKey(['李, 小龙'], null, 'HL000003')).toBe('sourcend_HL000003');
	});
	it('DOIs become resolver URLs with the characters the DOI Handbook asks to encode', () =>
		expect(doiUrl('10.1002/(SICI)1097<12:1>#x y')).toBe(
			'https://doi.org/10.1002/(SICI)1097%3C12:1%3E%23x%20y'
		));
});
