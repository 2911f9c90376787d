import { describe, expect, it } from 'vitest';
import type { CatalogueFacets, PotentialDto } from '$lib/catalogue/dto';
import { searchFacets, searchRow, searchRows } from '$lib/server/catalogue/searchRows';

/*
 * The search page shows the rows and facets as the server shapes them (searchRows.ts). Oracle:
 * the display rules of src/lib/format.ts and the vocabularies' labels, worked by hand per field.
 */
const MINUS = '\u2212';
const NBSP = '\u00a0';

const potential: PotentialDto = {
	accession: 'HL000123',
	version: 2,
	centre: { accession: 'HL000100', label: 'N2', cofactorKind: 'fe4s4' },
	protein: { accession: 'HL000050', name: 'Complex I', organism: 'Thermus demo' },
	couple: '[4Fe-4S]2+/1+',
	emMvShe: -412.94,
	reported: { value: -0.6229, unit: 'V', referenceElectrode: 'AgAgCl_3M' },
	ph: 7,
	temperatureK: 298.15,
	ionicStrengthM: null,
	buffer: null,
	method: 'protein_film_voltammetry',
	nElectrons: 1,
	uncertaintyMv: 10,
	source: { accession: 'HL000010', doi: null, year: 2019, firstAuthor: 'Doe, J.' },
	isDemo: true
};

describe('search rows', () => {
	it('formats each field by its rule and labels each identifier', () => {
		expect(searchRow(potential)).toEqual({
			accession: 'HL000123',
			isDemo: true,
			protein: { accession: 'HL000050', name: 'Complex I', organism: 'Thermus demo' },
			centre: { accession: 'HL000100', label: 'N2' },
			kind: '[4Fe-4S]',
			couple: { text: '[4Fe-4S]2+/1+', typeset: '[4Fe-4S]²⁺/¹⁺' },
			em: `${MINUS}413${NBSP}mV`,
			uncertainty: `10${NBSP}mV`,
			reported: `${MINUS}0.6229${NBSP}V vs Ag/AgCl (3 M KCl)`,
			ph: `pH${NBSP}7.0`,
			phValue: '7.0',
			temperature: `298.15${NBSP}K`,
			temperatureValue: '298.15',
			method: { short: 'PFV', name: 'protein film voltammetry' },
			source: { accession: 'HL000010', name: 'Doe 2019' }
		});
	});

	it('shows a dash for what is unknown and names a source without author or year by accession', () => {
		const row = searchRow({
			...potential,
			ph: null,
			temperatureK: null,
			uncertaintyMv: null,
			source: { accession: 'HL000011', doi: null, year: null, firstAuthor: null }
		});
		expect([row.ph, row.phValue, row.temperature, row.temperatureValue]).toEqual([
			'—',
			'—',
			'—',
			'—'
		]);
		expect(row.uncertainty).toBeNull();
		expect(row.source).toEqual({ accession: 'HL000011', name: 'HL000011' });
		expect(searchRow({ ...potential, source: null }).source).toBeNull();
	});

	it('keeps the paging of the API page', () => {
		const page = { total: 30, offset: 25, nextCursor: null, prevCursor: 'p', items: [potential] };
		const shaped = searchRows(page);
		expect({ ...shaped, rows: shaped.rows.length }).toEqual({
			total: 30,
			offset: 25,
			nextCursor: null,
			prevCursor: 'p',
			rows: 1
		});
	});
});

describe('search facets', () => {
	const facets: CatalogueFacets = {
		kinds: [{ value: 'fe4s4', count: 20 }],
		organisms: [{ value: 'Thermus demo', count: 12 }],
		methods: [{ value: 'epr_titration', count: 21 }],
		totals: { proteins: 1, centres: 2, potentials: 3 }
	};

	it('labels the choices and keeps a chosen choice without matches, with a count of 0', () => {
		const shaped = searchFacets(facets, {
			kind: ['fe4s4', 'heme_c'],
			method: ['epr_titration'],
			organism: ['Nowhere'],
			page: 1,
			size: 25
		});
		expect(shaped.kinds).toEqual([
			{ value: 'fe4s4', label: '[4Fe-4S]', count: 20 },
			{ value: 'heme_c', label: 'heme c', count: 0 }
		]);
		expect(shaped.organisms).toEqual([
			{ value: 'Thermus demo', label: 'Thermus demo', count: 12 },
			{ value: 'Nowhere', label: 'Nowhere', count: 0 }
		]);
		expect(shaped.methods).toEqual([
			{ value: 'epr_titration', label: 'EPR-monitored redox titration', count: 21 }
		]);
	});
});
