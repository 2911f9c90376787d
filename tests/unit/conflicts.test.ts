import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	conflictsForShown,
	potentialConflict,
	CONFLICT_RULES,
	type ListedPotential
} from '$lib/catalogue/conflicts';

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
