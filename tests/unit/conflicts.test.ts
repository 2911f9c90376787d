import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	CONFLICT_HEADING,
	CONFLICT_RULES,
	conflictWarning,
	conflictsForShown,
	describeConflictRule,
	potentialConflict,
	type ListedPotential
} from '$lib/catalogue/conflicts';
import { warningText } from '$lib/catalogue/warningText';

describe('values that differ beyond their stated uncertainties', () => {
	const base = { couple: 'Fe3+/Fe2+', emMvShe: 100, uncertaintyMv: 3, ph: 7, temperatureK: 298.15 };
	// JCGM 100:2008 (GUM): u_c of a difference of two uncorrelated values is √(u₁² + u₂²)
	// (§5.1.2, sensitivity coefficients ±1); the limit is k·u_c with k = 2 (§6.2.1, §6.3.3).
	it('flags beyond 2·√(u₁² + u₂²): a 3–4–5 triangle puts the line at 10 mV', () => {
		expect(potentialConflict(base, { ...base, emMvShe: 110, uncertaintyMv: 4 })).toBeNull();
		const c = potentialConflict(base, { ...base, emMvShe: 110.1, uncertaintyMv: 4 });
		expect(c?.combinedUncertaintyMv).toBe(5);
		expect(c?.limitMv).toBe(10);
		expect(c?.differenceMv).toBeCloseTo(-10.1, 6);
		expect(c?.message).toBe('differs by 10.1 mV, more than 2 × √(u₁² + u₂²) = 10 mV');
	});
	// Two replicates 30 mV apart at ±20 mV each: k = 1 flagged them (30 > 28.3 mV); k = 2 puts the line at 56.6 mV.
	it('does not flag two replicates 30 mV apart with ±20 mV each', () => {
		const a = { ...base, uncertaintyMv: 20 };
		expect(potentialConflict(a, { ...a, emMvShe: 130 })).toBeNull();
		expect(potentialConflict(a, { ...a, emMvShe: 156 })).toBeNull();
		expect(potentialConflict(a, { ...a, emMvShe: 157 })?.limitMv).toBe(56.6);
	});
	it('uses k = 2', () => expect(CONFLICT_RULES.coverageFactor).toBe(2));
	it('compares only comparable conditions', () => {
		const far = { ...base, emMvShe: 300 };
		expect(potentialConflict(base, { ...far, ph: 7 + CONFLICT_RULES.phWindow + 0.1 })).toBeNull();
		expect(potentialConflict(base, { ...far, temperatureK: 320 })).toBeNull();
		expect(potentialConflict(base, { ...far, ph: null })).toBeNull();
		expect(potentialConflict(base, { ...far, couple: 'other' })).toBeNull();
		expect(potentialConflict(base, far)).not.toBeNull();
	});
	// Decision (conflicts.ts): "beyond their stated uncertainties" needs both to be stated; an
	// assumed 15 mV (the earlier rule) was a number with no source.
	it('never compares a value without a stated uncertainty, however far', () => {
		const none = { ...base, uncertaintyMv: null };
		expect(potentialConflict(none, { ...base, emMvShe: 900 })).toBeNull();
		expect(potentialConflict({ ...base, emMvShe: 900 }, none)).toBeNull();
		expect(potentialConflict(none, { ...none, emMvShe: 900 })).toBeNull();
	});
	it('states the rule with its coverage factor and what happens without an uncertainty', () => {
		expect(describeConflictRule()).toContain('k = 2');
		expect(describeConflictRule()).toContain('JCGM 100:2008');
		expect(describeConflictRule()).toContain('without a stated uncertainty are not compared');
	});
	it('words a warning neutrally, with the rule as its source', () => {
		const c = potentialConflict(base, { ...base, emMvShe: 200, uncertaintyMv: 4 });
		const w = conflictWarning({ accession: 'HL000012', emMvShe: 200 }, c!);
		expect(w).toEqual({
			message:
				'Approved HL000012 (200 mV vs SHE, at comparable pH and temperature): differs by 100 mV, more than 2 × √(u₁² + u₂²) = 10 mV.',
			source: describeConflictRule(),
			accession: 'HL000012'
		});
		expect(`${w.message} ${CONFLICT_HEADING}`).not.toMatch(/conflict/i);
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

describe('conflict warnings stored under the earlier rule (frozen with their rows)', () => {
	// Text as written by the CSV check before k = 2 (tests/integration/versionWarnings.test.ts).
	const old = {
		kind: 'conflict' as const,
		field: 'reportedValue',
		message:
			'conflicts with approved HL000012: differs by 500 mV, more than the combined uncertainty of 21 mV',
		accession: 'HL000012'
	};
	it('are shown as written, with the rule that made them', () =>
		expect(warningText(old)).toBe(
			`${old.message} (flagged under the earlier rule: difference beyond √(u₁² + u₂²) (k = 1), 15 mV assumed where no uncertainty was stated)`
		));
	it('new ones carry the current rule and need no note', () => {
		const c = potentialConflict(
			{ couple: 'x', emMvShe: 0, uncertaintyMv: 5, ph: 7, temperatureK: 298.15 },
			{ couple: 'x', emMvShe: 500, uncertaintyMv: 20, ph: 7, temperatureK: 298.15 }
		)!;
		const w = {
			kind: 'conflict' as const,
			field: 'reportedValue',
			...conflictWarning({ accession: 'HL000012', emMvShe: 500 }, c)
		};
		expect(warningText(w)).toBe(w.message);
	});
});
