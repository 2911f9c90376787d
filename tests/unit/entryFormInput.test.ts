import { describe, expect, it } from 'vitest';
import { readEntryForm, splitNumberList } from '$lib/catalogue/entryForm';
import { templateCsv } from '$lib/catalogue/uploadColumns';
import { typicalRange } from '$lib/catalogue/typicalRanges';
import { COFACTOR_KINDS, COUPLES_BY_KIND } from '$lib/schemas/vocabulary';
import { EXAMPLE_ROW_MESSAGE, EXAMPLE_ROW_NOTE, isTemplateExampleRow } from '$lib/kinds/csvColumns';
import { ENTRY_KINDS, KINDS, UPLOAD_KINDS } from '$lib/kinds';
import { suggestionQuerySchema, suggestionWords } from '$lib/schemas/suggestions';
import Papa from 'papaparse';

// Issue 14 §3 and §4: what an entry form reads from typed text, the required choices, the
// reference fields, and the template's example row. Each test fails on the code before it.

describe('numbers typed into entry forms', () => {
	it('read a Unicode minus, a decimal comma and surrounding spaces in every numeric field', () => {
		const r = readEntryForm('potential', {
			reportedValue: '  \u22120,25  ',
			ph: ' 7,5 ',
			ionicStrengthM: '0,1',
			uncertaintyMv: ' 12,5',
			temperatureK: '25,5 °C',
			reportedUnit: 'mV',
			referenceElectrode: 'SHE',
			method: 'epr_titration'
		});
		expect(r.errors).toEqual({});
		// 25.5 °C = 298.65 K (0 °C = 273.15 K, the SI definition of the kelvin's offset).
		expect(r.value).toMatchObject({
			reportedValue: -0.25,
			ph: 7.5,
			ionicStrengthM: 0.1,
			uncertaintyMv: 12.5,
			temperatureK: 298.65
		});
		const d = readEntryForm('distance', { edgeToEdgeA: '11,2', centreToCentreA: '\u221214,0' });
		expect(d.value).toMatchObject({ edgeToEdgeA: 11.2, centreToCentreA: -14 });
	});
	it('read lists written with decimal commas when spaces or semicolons separate the items', () => {
		expect(splitNumberList('2,05 1,94 1,89')).toEqual({
			items: ['2,05', '1,94', '1,89'],
			decimalComma: true
		});
		const s = readEntryForm('spin_record', { gValues: '2,05; 1,94; 1,89' });
		expect(s.value.gValues).toEqual([2.05, 1.94, 1.89]);
		const c = readEntryForm('centre', {
			coordinatesA: '10,1 \u22124,2 33,0',
			residues: '45,48,51'
		});
		expect(c.value).toMatchObject({
			coordinatesA: { x: 10.1, y: -4.2, z: 33 },
			residues: [45, 48, 51]
		});
		// Points and commas together: the commas separate.
		expect(readEntryForm('spin_record', { gValues: '2.05, 1.94' }).value.gValues).toEqual([
			2.05, 1.94
		]);
	});
	it('refuses an ambiguous thousands comma rather than guessing', () => {
		expect(
			readEntryForm('potential', { reportedValue: '1,000' }).errors.reportedValue?.[0]
		).toMatch(/expected a plain decimal number/);
	});
});

describe('required choices', () => {
	it('are refused by name when left on "choose…"', () => {
		const r = readEntryForm('potential', { reportedUnit: '', referenceElectrode: '', method: '' });
		expect(r.errors.reportedUnit).toEqual(['choose the unit as reported']);
		expect(r.errors.referenceElectrode).toEqual(['choose the reference electrode']);
		expect(r.errors.method).toEqual(['choose the method']);
		const c = readEntryForm('centre', { cofactorKind: '' });
		expect(c.errors.cofactorKind).toEqual(['choose the cofactor type']);
	});
	it('has every select of every kind required or optional, never defaulted by the form', () => {
		for (const kind of ENTRY_KINDS)
			for (const f of KINDS[kind].formFields.filter((f) => f.type === 'select' && f.required))
				expect(readEntryForm(kind, {}).errors[f.name]?.[0]).toMatch(/^choose the /);
	});
});

describe('reference fields', () => {
	it('offer suggestions for exactly the fields that name other entries, of the kind named', () => {
		for (const kind of ENTRY_KINDS) {
			const lookups = Object.fromEntries(
				KINDS[kind].formFields.filter((f) => f.lookup).map((f) => [f.name, f.lookup])
			);
			expect(lookups).toEqual(KINDS[kind].references);
		}
	});
	it('keep the accession hint in CSV columns, where names are given by other columns', () => {
		const csv = KINDS.potential.upload.columns.find((c) => c.name === 'centreAccession');
		expect(csv?.hint).toBe('accession, e.g. HL000123');
	});
	it('bound the suggestion query: text length, words, answers', () => {
		expect(suggestionQuerySchema.safeParse({ type: 'centre', q: 'N2' }).data).toEqual({
			type: 'centre',
			q: 'N2',
			limit: 8
		});
		expect(suggestionQuerySchema.safeParse({ type: 'centre', q: '   ' }).success).toBe(false);
		expect(suggestionQuerySchema.safeParse({ type: 'centre', q: 'x'.repeat(101) }).success).toBe(
			false
		);
		expect(suggestionQuerySchema.safeParse({ type: 'potential', q: 'N2' }).success).toBe(false);
		expect(suggestionQuerySchema.safeParse({ type: 'source', q: 'a', limit: '21' }).success).toBe(
			false
		);
		expect(suggestionQuerySchema.safeParse({ type: 'source', q: 'a', extra: '1' }).success).toBe(
			false
		);
		expect(suggestionWords('  Cluster   A, ferredoxin; demo extra words ')).toEqual([
			'cluster',
			'a',
			'ferredoxin',
			'demo'
		]);
	});
});

describe('the CSV templates', () => {
	it('mark their example row so that a check refuses it', () => {
		for (const kind of UPLOAD_KINDS) {
			const parsed = Papa.parse<Record<string, string>>(templateCsv(kind), { header: true });
			const row = parsed.data[0] as Record<string, string>;
			expect(row.note, kind).toBe(EXAMPLE_ROW_NOTE);
			expect(isTemplateExampleRow(row.note)).toBe(true);
		}
		expect(isTemplateExampleRow(`  ${EXAMPLE_ROW_NOTE.toUpperCase()}  `)).toBe(true);
		expect(isTemplateExampleRow('invented example row')).toBe(false);
		expect(isTemplateExampleRow(undefined)).toBe(false);
		expect(EXAMPLE_ROW_MESSAGE).toMatch(/example row/);
	});
});

describe('warning sources', () => {
	it("say what a range is based on in a reader's words", () => {
		const sources = new Set<string>();
		for (const kind of COFACTOR_KINDS)
			for (const couple of COUPLES_BY_KIND[kind] ?? []) {
				const source = typicalRange(kind, couple)?.source;
				if (source) sources.add(source);
			}
		expect(sources.size).toBe(3);
		for (const source of sources) {
			expect(source).toMatch(/bounds approximate/);
			expect(source).not.toMatch(/memory|recalled|no source/i);
		}
	});
});
