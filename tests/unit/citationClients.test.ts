import { readFileSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { Cite, plugins, type CslData } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import '@citation-js/plugin-ris';
import CSL from 'citeproc';
import { citeRecord } from '$lib/catalogue/citation';
import { POTENTIAL } from '../support/citations';

/*
 * Hopline's citations read by independent tools, as reference managers would: citation-js
 * (npm @citation-js/core 0.8.2 with its BibTeX and RIS plugins) parses the BibTeX and RIS, and
 * citeproc-js (npm citeproc 2.4.63, the engine of Zotero and Mendeley) renders the CSL-JSON with
 * standard CSL styles (tests/fixtures/csl, source and licence in its README). The expected
 * bibliography lines are what those tools print; they are the oracle, not Hopline's own text.
 */

const citations = citeRecord(POTENTIAL, '2026-12-02');

function byId(items: CslData[], id: string): CslData {
	const item = items.find((i) => i.id === id || i['citation-key'] === id);
	if (!item) throw new Error(`no item ${id} in ${items.map((i) => i.id).join(', ')}`);
	return item;
}

function families(item: CslData, role = 'author'): string[] {
	const names = (item[role] ?? []) as { family?: string; 'non-dropping-particle'?: string }[];
	return names.map((n) => [n['non-dropping-particle'], n.family].filter(Boolean).join(' '));
}

describe('citation-js reads the BibTeX', () => {
	const bibtexConfig = plugins.config.get('@bibtex').parse as Record<string, unknown>;
	const before = { ...bibtexConfig };
	afterEach(() => Object.assign(bibtexConfig, before));

	it('as biblatex: the record with version, access date and editor, and the paper with its DOI', async () => {
		const cite = await Cite.async(citations.bibtex, { forceType: '@biblatex/text' });
		expect(cite.data).toHaveLength(2);
		const record = byId(cite.data, 'hopline_HL000046_v2');
		expect(record.title).toBe(POTENTIAL.title);
		expect(record.version).toBe('2');
		expect(record.URL).toBe(POTENTIAL.permalink);
		expect(record.issued).toEqual({ 'date-parts': [[2024, 3, 11]] });
		expect(record.accessed).toEqual({ 'date-parts': [[2026, 12, 2]] });
		expect(families(record)).toEqual(['Lovelace', 'van Beethoven']);
		expect(families(record, 'editor')).toEqual(['Curator']);
		const paper = byId(cite.data, 'Muller2020_HL000003');
		expect(paper.type).toBe('article-journal');
		expect(paper.DOI).toBe('10.5555/demo_1');
		expect(families(paper)).toEqual(['Müller', 'Nguyễn']);
		// LaTeX read back: the Greek letter, the subscripts and superscript, the degree sign.
		expect(paper.title).toBe(
			'Redox titration of α-subunit Fe<sub>4</sub>S<sub>4</sub><sup>2+</sup> clusters at 25 °C'
		);
		expect(cite.data.flatMap((i) => Object.values(i)).join(' ')).not.toMatch(/\\[a-z]/i);
	});

	it('as classic BibTeX, keeping the title as written even when told to sentence-case titles', async () => {
		// What a style that lower-cases titles does: only braced text keeps its case, and CSL
		// marks it "nocase". The control: a title in one pair of braces is lower-cased.
		bibtexConfig.sentenceCase = 'always';
		const cite = await Cite.async(citations.bibtex, { forceType: '@bibtex/text' });
		const record = byId(cite.data, 'hopline_HL000046_v2');
		expect(record.title).toBe(`<span class="nocase">${POTENTIAL.title}</span>`);
		expect(record.URL).toBe(POTENTIAL.permalink);
		const unprotected = await Cite.async('@misc{x, title = {Ferredoxin From Thermus Demoensis}}', {
			forceType: '@bibtex/text'
		});
		expect(unprotected.data[0]?.title).toBe('Ferredoxin from thermus demoensis');
	});
});

describe('citation-js reads the RIS', () => {
	it('as a dataset and a journal article', async () => {
		const cite = await Cite.async(citations.ris, { forceType: '@ris/file' });
		expect(cite.data.map((i) => i.type)).toEqual(['dataset', 'article-journal']);
		const [record, paper] = cite.data as [CslData, CslData];
		expect(record).toMatchObject({
			title: POTENTIAL.title,
			version: '2',
			URL: POTENTIAL.permalink,
			publisher: 'Hopline',
			accessed: { 'date-parts': [[2026, 12, 2]] },
			issued: { 'date-parts': [[2024, 3, 11]] }
		});
		expect(families(record)).toEqual(['Lovelace', 'van Beethoven']);
		expect(paper).toMatchObject({
			title: POTENTIAL.original?.title,
			DOI: '10.5555/demo_1',
			'container-title': 'J. Demo Biochem.'
		});
	});
});

// Building an engine compiles the style; APA's 66 kB took 4–6 s on the shared machine.
describe('citeproc-js renders the CSL-JSON', { timeout: 60_000 }, () => {
	const items = JSON.parse(citations.cslJson) as { id: string }[];
	const locale = readFileSync('tests/fixtures/csl/locales-en-US.xml', 'utf8');

	function bibliography(styleFile: string): string[] {
		const engine = new CSL.Engine(
			{
				retrieveLocale: () => locale,
				retrieveItem: (id) => items.find((i) => i.id === id)
			},
			readFileSync(`tests/fixtures/csl/${styleFile}`, 'utf8'),
			'en-US'
		);
		engine.setOutputFormat('text');
		engine.updateItems(items.map((i) => i.id));
		const result = engine.makeBibliography();
		if (!result) throw new Error('no bibliography');
		return result[1].map((line) => line.trim());
	}

	it('in APA 7th edition', () => {
		expect(bibliography('apa.csl')).toEqual([
			'Lovelace, A., & van Beethoven, L. (2024). Em of [4Fe-4S]2+/1+ of FS1 in RoxA–H & NADH_site (50% reduced) (C. Curator, Ed.; No. HL000046; Version 2) [Dataset]. Hopline. https://hopline.example/e/HL000046/v2',
			'Müller, J., & Nguyễn, T. (2020). Redox titration of α-subunit Fe₄S₄²⁺ clusters at 25 °C. J. Demo Biochem. https://doi.org/10.5555/demo_1'
		]);
	});

	it('in Vancouver, with the access date', () => {
		const [record, paper] = bibliography('vancouver.csl');
		expect(record).toContain('[cited 2026 Dec 2]');
		expect(record).toContain('Available from: https://hopline.example/e/HL000046/v2');
		expect(paper).toContain('doi:10.5555/demo_1');
		expect(paper).toContain('PubMed PMID: 123456');
	});
});
