import { describe, expect, it } from 'vitest';
import { entryFormValues, readEntryForm } from '$lib/catalogue/entryForm';
import { KINDS, type KindModule, ENTRY_KINDS } from '$lib/kinds';
import { parseEntryInput } from '$lib/schemas/submission';

describe('entry forms', () => {
	it('lists, for each kind, only fields its schema knows', () => {
		for (const kind of ENTRY_KINDS) {
			const module: KindModule = KINDS[kind];
			const input = module.input?.schema ?? module.schema;
			const shape = Object.keys(
				(input as unknown as { shape?: object }).shape ??
					(input as unknown as { def: { in: { shape: object } } }).def.in.shape
			);
			for (const f of module.formFields) expect(shape).toContain(f.name);
		}
	});
	it('reads the minus sign, °C, lists and coordinates', () => {
		const r = readEntryForm('potential', {
			reportedValue: '\u2212320',
			temperatureK: '25 °C',
			ph: '7.0'
		});
		expect(r.value).toMatchObject({ reportedValue: -320, temperatureK: 298.15, ph: 7 });
		const c = readEntryForm('centre', { residues: '12, 15; 18', coordinatesA: '1.5, -2, 3e1' });
		expect(c.value).toMatchObject({
			residues: [12, 15, 18],
			coordinatesA: { x: 1.5, y: -2, z: 30 }
		});
		const s = readEntryForm('source', { authors: 'Doe, Jane\nRoe, Richard' });
		expect(s.value.authors).toEqual(['Doe, Jane', 'Roe, Richard']);
	});
	it('names what it cannot read, by field', () => {
		const r = readEntryForm('potential', { reportedValue: 'minus 3', temperatureK: '-300 °C' });
		expect(r.errors.reportedValue?.[0]).toMatch(
			/^expected a plain decimal number .*; got "minus 3"$/
		);
		expect(r.errors.temperatureK?.[0]).toMatch(/expected a temperature/);
		const c = readEntryForm('centre', { coordinatesA: '1, 2' });
		expect(c.errors.coordinatesA?.[0]).toMatch(/three numbers/);
	});
	it('round-trips stored data through the form text', () => {
		const data = {
			proteinAccession: 'HL000001',
			label: 'N2',
			cofactorKind: 'fe4s4',
			ligation: 'Cys4',
			chainId: 'B',
			residues: [45, 46],
			coordinatesA: { x: 1, y: 2.5, z: -3 },
			note: null
		};
		const read = readEntryForm('centre', entryFormValues('centre', data));
		expect(parseEntryInput('centre', read.value)).toEqual({
			ok: true,
			entry: { kind: 'centre', data }
		});
	});
	it('says "required" for a missing required field', () => {
		const r = parseEntryInput('potential', {});
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.fields.centreAccession).toEqual(['required']);
	});
	it('normalises a potential to mV vs SHE on the way in', () => {
		const r = parseEntryInput('potential', {
			centreAccession: 'HL000001',
			couple: 'Fe3+/Fe2+',
			reportedValue: -0.1,
			reportedUnit: 'V',
			referenceElectrode: 'SHE',
			method: 'optical_titration'
		});
		expect(r.ok && r.entry.kind === 'potential' && r.entry.data.emMvShe).toBe(-100);
	});
});
