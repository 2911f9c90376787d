import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	conflictsForShown,
	potentialConflict,
	CONFLICT_RULES,
	type ListedPotential
} from '$lib/catalogue/conflicts';
import { entryFormValues, readEntryForm } from '$lib/catalogue/entryForm';
import { checkTypicalRange, typicalRange } from '$lib/catalogue/typicalRanges';
import {
	parseEntryInput,
	reviewDecisionSchema,
	visibilityRequestSchema
} from '$lib/schemas/submission';
import { KINDS, type KindModule } from '$lib/kinds';
import { ENTRY_KINDS } from '$lib/schemas/vocabulary';
import { match as matchId } from '../../src/params/id';
import { match as matchKind } from '../../src/params/kind';

describe('typical potential ranges', () => {
	// Well-known values that any sensible range must hold (all from memory, rounded):
	it.each([
		['fe4s4', '[4Fe-4S]2+/1+', -400], // bacterial 2[4Fe-4S] ferredoxin, about −400 mV
		['fe4s4_hipip', '[4Fe-4S]3+/2+', 350], // purple-bacterial HiPIP, about +350 mV
		['heme_c', 'Fe3+/Fe2+', 260], // mitochondrial cytochrome c, about +260 mV
		['cu_type1', 'Cu2+/Cu+', 310], // azurin, about +310 mV
		['fe2s2_ferredoxin', '[2Fe-2S]2+/1+', -420], // plant-type ferredoxin, about −420 mV
		['fe2s2_rieske', '[2Fe-2S]2+/1+', 280] // bc1-complex Rieske centre, about +280 mV
	] as const)('%s %s holds %d mV', (kind, couple, em) => {
		expect(checkTypicalRange(kind, couple, em)).toBeNull();
	});
	it('warns about a sign slip, naming the range and its source', () => {
		const w = checkTypicalRange('fe4s4', '[4Fe-4S]2+/1+', 400);
		expect(w?.message).toContain('above the typical range');
		expect(w?.message).toContain('-750 to -50');
		expect(w?.range.source).toMatch(/from memory/);
	});
	it('has no range for "other" or an unknown couple, so it never warns there', () => {
		expect(typicalRange('other', 'X/Y')).toBeNull();
		expect(checkTypicalRange('heme_b', 'Fe4+/Fe3+', 1500)).toBeNull();
	});
});

describe('conflicting potentials', () => {
	const base = { couple: 'Fe3+/Fe2+', emMvShe: 100, uncertaintyMv: 3, ph: 7, temperatureK: 298.15 };
	it('conflict beyond √(u₁² + u₂²): a 3–4–5 triangle sits exactly on the line', () => {
		expect(potentialConflict(base, { ...base, emMvShe: 105, uncertaintyMv: 4 })).toBeNull();
		const c = potentialConflict(base, { ...base, emMvShe: 105.1, uncertaintyMv: 4 });
		expect(c?.combinedUncertaintyMv).toBe(5);
		expect(c?.differenceMv).toBeCloseTo(-5.1, 6);
	});
	it('compares only comparable conditions', () => {
		const far = { ...base, emMvShe: 300 };
		expect(potentialConflict(base, { ...far, ph: 7 + CONFLICT_RULES.phWindow + 0.1 })).toBeNull();
		expect(potentialConflict(base, { ...far, temperatureK: 320 })).toBeNull();
		expect(potentialConflict(base, { ...far, ph: null })).toBeNull();
		expect(potentialConflict(base, { ...far, couple: 'other' })).toBeNull();
		expect(potentialConflict(base, far)).not.toBeNull();
	});
	it('assumes the default uncertainty where none is given', () => {
		const a = { ...base, uncertaintyMv: null };
		const limit = Math.hypot(
			CONFLICT_RULES.defaultUncertaintyMv,
			CONFLICT_RULES.defaultUncertaintyMv
		);
		expect(potentialConflict(a, { ...a, emMvShe: 100 + limit - 0.2 })).toBeNull();
		expect(potentialConflict(a, { ...a, emMvShe: 100 + limit + 0.2 })).not.toBeNull();
	});
	it('flags both sides, and never across centres', () => {
		const list = [
			{ ...base, accession: 'HL000001', centre: { accession: 'HL000100' } },
			{ ...base, emMvShe: 200, accession: 'HL000002', centre: { accession: 'HL000100' } },
			{ ...base, emMvShe: 400, accession: 'HL000003', centre: { accession: 'HL000101' } }
		];
		const flags = conflictsForShown(list, list);
		expect(flags.get('HL000001')?.listed.map((f) => f.accession)).toEqual(['HL000002']);
		expect(flags.get('HL000002')?.listed.map((f) => f.accession)).toEqual(['HL000001']);
		expect(flags.has('HL000003')).toBe(false);
	});
	it('counts every conflict but names only the largest few', () => {
		const many = Array.from({ length: 5000 }, (_, i) => ({
			...base,
			emMvShe: 100 + (i + 1) * 50,
			accession: `HL${String(i + 10).padStart(6, '0')}`,
			centre: { accession: 'HL000100' }
		}));
		const shown = { ...base, accession: 'HL000001', centre: { accession: 'HL000100' } };
		const flags = conflictsForShown([shown], [shown, ...many]).get('HL000001');
		expect(flags?.count).toBe(5000);
		expect(flags?.listed).toHaveLength(5);
		expect(flags?.listed[0]?.accession).toBe('HL005009');
	});
	it('agrees with comparing every pair (the rule itself as the oracle)', () => {
		const potential = fc.record({
			accession: fc.integer({ min: 1, max: 60 }).map((n) => `HL${String(n).padStart(6, '0')}`),
			centre: fc.constantFrom('HL000100', 'HL000101').map((accession) => ({ accession })),
			couple: fc.constantFrom('[4Fe-4S]2+/1+', '[4Fe-4S]1+/0'),
			emMvShe: fc.integer({ min: -500, max: 500 }),
			uncertaintyMv: fc.option(fc.integer({ min: 1, max: 60 }), { nil: null }),
			ph: fc.option(
				fc.integer({ min: 50, max: 100 }).map((x) => x / 10),
				{ nil: null }
			),
			temperatureK: fc.option(fc.constantFrom(277, 288, 298.15, 310, 338), { nil: null })
		});
		fc.assert(
			fc.property(
				fc.uniqueArray(potential, { selector: (p) => p.accession, maxLength: 40 }),
				(list) => {
					const flags = conflictsForShown(list, list, 1000);
					for (const p of list) {
						const expected = list
							.filter(
								(q: ListedPotential) =>
									q.accession !== p.accession &&
									q.centre.accession === p.centre.accession &&
									potentialConflict(p, q) !== null
							)
							.map((q) => q.accession)
							.sort();
						const got = (flags.get(p.accession)?.listed ?? []).map((f) => f.accession).sort();
						expect(got).toEqual(expected);
						expect(flags.get(p.accession)?.count ?? 0).toBe(expected.length);
					}
				}
			)
		);
	});
});

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
		expect(r.errors.reportedValue?.[0]).toBe('expected a number, got "minus 3"');
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

describe('visibility requests and decisions', () => {
	it('needs a group for group-only, and a future date and a group for an embargo', () => {
		const g = visibilityRequestSchema.safeParse({ visibility: 'group' });
		expect(g.success || g.error.issues.map((i) => i.path[0])).toEqual(['groupId']);
		const e = visibilityRequestSchema.safeParse({
			visibility: 'embargoed',
			embargoUntil: '2001-01-01'
		});
		expect(e.success || e.error.issues.map((i) => i.message)).toEqual([
			'the embargo must end in the future',
			'choose the group that may see it until then'
		]);
		expect(
			visibilityRequestSchema.parse({
				visibility: 'embargoed',
				groupId: '3',
				embargoUntil: '2099-05-01'
			})
		).toEqual({
			visibility: 'embargoed',
			groupId: 3,
			embargoUntil: '2099-05-01T00:00:00.000Z'
		});
		expect(
			visibilityRequestSchema.parse({ visibility: 'public', groupId: '3' }).groupId
		).toBeNull();
	});
	it('needs a comment to return and a reason to reject, not to approve', () => {
		expect(reviewDecisionSchema.safeParse({ decision: 'approve' }).success).toBe(true);
		expect(reviewDecisionSchema.safeParse({ decision: 'return', comment: ' ' }).success).toBe(
			false
		);
		expect(
			reviewDecisionSchema.safeParse({ decision: 'reject', comment: 'duplicate' }).success
		).toBe(true);
		expect(reviewDecisionSchema.safeParse({ decision: 'maybe' }).success).toBe(false);
	});
});

describe('route matchers', () => {
	it('id: positive integers without leading zeros', () => {
		expect(['1', '42', '9999999999'].every(matchId)).toBe(true);
		expect(['0', '01', '-1', '1.5', 'x', '12345678901'].some(matchId)).toBe(false);
	});
	it('kind: the entry kinds', () => {
		expect(matchKind('spin_record')).toBe(true);
		expect(matchKind('spin-record')).toBe(false);
	});
});

describe('a potential that converts out of range', () => {
	it('is an error on the reported value, not an exception', () => {
		const r = parseEntryInput('potential', {
			centreAccession: 'HL000001',
			couple: 'Fe3+/Fe2+',
			reportedValue: 5,
			reportedUnit: 'V',
			referenceElectrode: 'SHE',
			method: 'computed'
		});
		expect(r).toEqual({
			ok: false,
			fields: {
				reportedValue: ['converts to 5000 mV vs SHE, outside -2000 to 2000 mV; check the unit']
			}
		});
	});
});
