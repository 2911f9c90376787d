import { describe, expect, it } from 'vitest';
import { entryHead, jsonForScript } from '$lib/catalogue/entryMetadata';
import { POTENTIAL } from '../support/citations';

const CITATION = {
	record: POTENTIAL,
	basedOn: [
		{
			accession: 'HL000020',
			version: 1,
			kind: 'centre' as const,
			title: 'FS1 of RoxA–H',
			permalink: 'https://hopline.example/e/HL000020/v1'
		}
	]
};

describe('the head of an entry page', () => {
	const head = entryHead(CITATION, 'Potential', 'https://hopline.example');
	const meta = (key: string) => head.meta.filter((m) => m.key === key).map((m) => m.content);

	it('links to the versioned permalink as canonical, and to the JSON and each citation file', () => {
		expect(head.links).toContainEqual({ rel: 'canonical', href: POTENTIAL.permalink });
		const alternates = head.links.filter((l) => l.rel === 'alternate').map((l) => [l.type, l.href]);
		expect(alternates).toEqual([
			['application/json', '/api/v1/entries/HL000046?version=2'],
			['application/x-bibtex', '/e/HL000046/v2/cite.bib'],
			['application/x-research-info-systems', '/e/HL000046/v2/cite.ris'],
			['application/vnd.citationstyles.csl+json', '/e/HL000046/v2/cite.json']
		]);
	});
	// Highwire Press tags as Google Scholar's inclusion guidelines list them.
	it('carries citation_* tags, each author followed by their ORCID iD', () => {
		expect(meta('citation_title')).toEqual([POTENTIAL.title]);
		expect(meta('citation_author')).toEqual(['Ada Lovelace', 'Ludwig van Beethoven']);
		const names = head.meta.map((m) => m.key);
		expect(names.indexOf('citation_author_orcid')).toBe(names.indexOf('citation_author') + 1);
		expect(meta('citation_publication_date')).toEqual(['2024/03/11']);
		expect(meta('citation_public_url')).toEqual([POTENTIAL.permalink]);
		expect(meta('citation_reference')[0]).toContain('citation_doi=10.5555/demo_1');
		// The record has no DOI of its own; the paper's is not passed off as the record's.
		expect(meta('citation_doi')).toEqual([]);
	});
	it('carries Dublin Core and Open Graph tags', () => {
		expect(meta('DC.identifier')).toEqual([POTENTIAL.permalink]);
		expect(meta('DC.contributor')).toEqual(['Carl Curator']);
		expect(meta('DC.source')).toEqual(['https://doi.org/10.5555/demo_1']);
		expect(meta('DC.relation')).toEqual(['https://hopline.example/e/HL000020/v1']);
		expect(head.meta.find((m) => m.key === 'og:title')?.attribute).toBe('property');
		expect(meta('og:description')[0]).toMatch(/^Potential record HL000046, version 2/);
	});
	it('describes the version as a schema.org Dataset in JSON-LD', () => {
		const ld = JSON.parse(head.jsonLd);
		expect(ld).toMatchObject({
			'@context': 'https://schema.org',
			'@type': 'Dataset',
			version: '2',
			url: POTENTIAL.permalink,
			citation: { '@type': 'ScholarlyArticle', '@id': 'https://doi.org/10.5555/demo_1' },
			isBasedOn: [{ '@id': 'https://hopline.example/e/HL000020/v1', version: '1' }]
		});
		expect(ld.identifier).toContain(POTENTIAL.permalink);
		expect(ld.creator[0]).toMatchObject({ '@id': 'https://orcid.org/0000-0002-1825-0097' });
	});
});

describe('JSON inside a script element', () => {
	it('cannot close the element or open markup, and parses back unchanged', () => {
		const hostile = { title: '</script><script>alert(1)</script><!-- & \u2028' };
		const text = jsonForScript(hostile);
		expect(text).not.toMatch(/[<>&\u2028]/);
		expect(JSON.parse(text)).toEqual(hostile);
	});
});
