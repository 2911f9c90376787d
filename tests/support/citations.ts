import type { CitableRecord } from '$lib/catalogue/citation';

/* Citable records for the citation tests: invented entries with the characters that break tools. */

/** A potential of an invented protein, credited to two contributors and a curator. */
export const POTENTIAL: CitableRecord = {
	accession: 'HL000046',
	version: 2,
	kind: 'potential',
	title: 'Em of [4Fe-4S]2+/1+ of FS1 in RoxA–H & NADH_site (50% reduced)',
	permalink: 'https://hopline.example/e/HL000046/v2',
	approvedAt: '2024-03-11T09:30:00.000Z',
	authors: [
		{ name: 'Ada Lovelace', orcid: '0000-0002-1825-0097' },
		{ name: 'Ludwig van Beethoven', orcid: null }
	],
	editors: [{ name: 'Carl Curator', orcid: null }],
	original: {
		key: 'Muller2020_HL000003',
		sourceKind: 'publication',
		title: 'Redox titration of α-subunit Fe₄S₄²⁺ clusters at 25 °C',
		authors: ['Müller, Jürgen', 'Nguyễn, Thị'],
		journal: 'J. Demo Biochem.',
		year: 2020,
		doi: '10.5555/demo_1',
		pubmedId: '123456',
		record: {
			accession: 'HL000003',
			version: 1,
			permalink: 'https://hopline.example/e/HL000003/v1'
		}
	}
};
