import { describe, expect, it } from 'vitest';
import { citeEntry, escapeBibtex } from '$lib/catalogue/citation';

const entry = {
	accession: 'HL000046',
	version: 2,
	title: 'Em of [4Fe-4S]2+/1+, centre C5 & 50% reduced_state',
	permalink: 'https://hopline.example/e/HL000046/v2',
	approvedAt: '2024-03-11T09:30:00.000Z',
	accessed: new Date('2026-12-02T10:00:00Z')
};

describe('citations', () => {
	const c = citeEntry(entry);
	it('BibTeX carries permalink, version and access date, with specials escaped', () => {
		expect(c.bibtex).toMatch(/^@misc\{hopline_HL000046_v2,/);
		expect(c.bibtex).toContain('url = {https://hopline.example/e/HL000046/v2}');
		expect(c.bibtex).toContain('version = {2}');
		expect(c.bibtex).toContain('urldate = {2026-12-02}');
		expect(c.bibtex).toContain('\\& 50\\% reduced\\_state');
	});
	// RIS tags per the RIS format specification (Research Information Systems): TY first, ER last.
	it('RIS starts with TY and ends with ER', () => {
		const lines = c.ris.split('\r\n');
		expect(lines[0]).toBe('TY  - DATA');
		expect(lines.at(-1)).toBe('ER  - ');
		expect(lines).toContain('UR  - https://hopline.example/e/HL000046/v2');
		expect(lines).toContain('Y2  - 2026/12/02');
	});
	// CSL-JSON schema (citation-style-language/schema, csl-data.json): type "dataset", date-parts.
	it('CSL-JSON is valid JSON of type dataset', () => {
		const [item] = JSON.parse(c.cslJson);
		expect(item.type).toBe('dataset');
		expect(item.version).toBe('2');
		expect(item.accessed['date-parts']).toEqual([[2026, 12, 2]]);
		expect(item.URL).toBe(entry.permalink);
	});
	it('plain text names the permalink and access date', () =>
		expect(c.text).toContain('https://hopline.example/e/HL000046/v2 (accessed 2026-12-02)'));
	it('escapes braces and backslashes for BibTeX', () =>
		expect(escapeBibtex('a{b}\\c')).toBe('a\\{b\\}\\textbackslash{}c'));
});
