import { describe, expect, it } from 'vitest';
import { tunnellingRequestSchema } from '$lib/schemas/calc';
import { tunnellingResponseSchema } from '$lib/schemas/calcResponses';
import { computedJson } from '$lib/server/api/respond';
import { tunnellingAnswer } from '$lib/server/calc/answers';
import {
	quarticDoubleWell,
	roundSignificant,
	runTunnelling,
	tunnellingPlot
} from '$lib/server/calc/tunnelling';

// The calculator service (server/calc/tunnelling.ts) on the API's inputs: what it answers, and
// that every answer is a valid, finite API body. The science is checked in tunnelling.test.ts.
const run = (body: unknown) => runTunnelling(tunnellingRequestSchema.parse(body));
const wellOf = (barrierKcalMol: number, halfSeparationA: number, asymmetryKcalMol = 0) => ({
	kind: 'double-well',
	barrierKcalMol,
	halfSeparationA,
	asymmetryKcalMol
});

describe('tunnelling calculator', () => {
	// The issue: κ ≈ 1e408 overflowed to Infinity, computedJson threw, and the API answered 500.
	it('50 K, 500 kJ/mol, 1000 cm⁻¹: log₁₀ κ = 408.39, κ itself null, a valid finite answer', async () => {
		const result = run({ imagFreqCm1: 1000, temperatureK: 50, barrierKJmol: 500 });
		expect(result.kappa?.bellTruncated).toBeNull();
		expect(result.kappa?.bellTruncatedLog10).toBeCloseTo(408.3902328, 6); // mpmath, see tunnelling.test.ts
		expect(result.kappa?.notes.join(' ')).toMatch(/exceeds double precision/);
		expect(result.kappa?.notes.join(' ')).toMatch(/T_c = 229\.0 K/);
		const answer = tunnellingAnswer(result);
		expect(tunnellingResponseSchema.safeParse(answer).success).toBe(true);
		const response = computedJson(answer);
		expect(response.status).toBe(200);
		expect((await response.json()).kappa.bellTruncatedLog10).toBeCloseTo(408.39, 2);
	});
	// κ_W = 1 + u²/24 against (u/2)/sin(u/2) (Bell 1980, ch. 2); 1000 cm⁻¹ at 298.15 K is u = 4.83:
	// 1.970 against 3.623, i.e. 46 % below; 400 cm⁻¹ is u = 1.93, inside the bound.
	it('the Wigner note gives the deficit against Bell and the bound u = 2 (κ_W = 1.5 at u ≈ 3.46)', () => {
		const notes = run({ imagFreqCm1: 1000, temperatureK: 298.15 }).kappa!.notes.join(' ');
		expect(notes).toMatch(/u = 4\.83 > 2: Wigner’s leading term \(1\.970\) is 46 % below/);
		expect(notes).toMatch(/κ_W = 1\.5 at u ≈ 3\.46/);
		expect(run({ imagFreqCm1: 400, temperatureK: 298.15 }).kappa!.notes).toEqual([]); // u = 1.93
	});
	it('a symmetric well: the barrier reported is the barrier entered, the grid is reported', () => {
		const result = run({ potential: wellOf(6, 0.35) });
		expect(result.doubleWell?.barrierKcalMol).toBeCloseTo(6, 9);
		expect(result.doubleWell?.barrierNote).toBeNull();
		expect(result.levels?.grid).toMatchObject({ converged: true, range: 'automatic' });
		expect(result.levels).not.toHaveProperty('comparison');
		expect(tunnellingResponseSchema.safeParse(tunnellingAnswer(result)).success).toBe(true);
	});
	it('the isotope effect is an order of magnitude: one significant figure', () => {
		const kie = run({ potential: wellOf(6, 0.35) }).isotopeEffect!.kie;
		// (Δ_H/Δ_D)² = (55.975 / 5.977 cm⁻¹)² = 87.70 by the harmonic-oscillator-basis reference
		// (numpy 2.4.6 eigh, N = 500 kept 350; see tunnelling.test.ts), so 90 at one figure.
		expect(kie).toBe(90);
		expect(roundSignificant(8228.4, 1)).toBe(8000);
		expect(roundSignificant(0.0456, 1)).toBe(0.05);
	});
	it('a tilted well: the barrier note says why the barrier differs; the isotope effect stays 8 × 10³', () => {
		// Untilted (Δ_H/Δ_D)² = 8 228 (oscillator-basis reference in tunnelling.test.ts); 0.965 before.
		const result = run({ potential: wellOf(12, 0.5, 0.2), levels: 2 });
		expect(result.isotopeEffect?.kie).toBe(8000);
		expect(result.doubleWell?.barrierNote).toMatch(
			/entered \(12 kcal\/mol\) is that of the untilted well/
		);
		expect(result.doubleWell?.barrierKcalMol).toBeCloseTo(12.1, 2);
	});
	it('no isotope effect in the regime called vibrationally adiabatic, and the notes say why', () => {
		const result = run({ potential: wellOf(0.1, 0.4) });
		expect(result.doubleWell?.regime).toBe('adiabatic');
		expect(result.isotopeEffect).toBeNull();
		expect(result.notes.join(' ')).toMatch(/No isotope effect .*vibrationally adiabatic/);
	});
	it('a given interval is kept and reported as given', () => {
		const result = run({ potential: wellOf(6, 0.35), xMinA: -1.2, xMaxA: 1.2, points: 200 });
		expect(result.levels?.grid).toMatchObject({
			xMinA: -1.2,
			xMaxA: 1.2,
			points: 200,
			range: 'given',
			resolution: 'given'
		});
	});
	it('the issue’s small well: E₀ = 1.553 kcal/mol on a chosen grid (7.571 on the old ±2.5a)', () => {
		const result = run({ potential: wellOf(0.01, 0.05), levels: 4 });
		expect(result.levels?.energiesKcalMol[0]).toBeCloseTo(1.5527305, 6); // oscillator basis
		expect(result.levels?.grid.converged).toBe(true);
	});
});

describe('the page’s plot', () => {
	it('samples V(x) from the potential itself and ψ between the grid points, over the grid', () => {
		const request = tunnellingRequestSchema.parse({ potential: wellOf(6, 0.35), levels: 2 });
		const levels = runTunnelling(request).levels!;
		const plot = tunnellingPlot(request, levels)!;
		expect(plot.xA).toHaveLength(241);
		expect(plot.xA[0]).toBe(levels.grid.xMinA);
		expect(plot.xA.at(-1)).toBeCloseTo(levels.grid.xMaxA, 12);
		const v = quarticDoubleWell(6, 0.35, 0);
		plot.xA.forEach((x, i) => expect(plot.potentialKcalMol[i]).toBe(v(x)));
		expect(plot.wavefunctions).toHaveLength(2);
		// Between its grid points the ground state stays close to its neighbours' values.
		const j = levels.gridA.findIndex((x) => x > 0.35);
		const mid = plot.xA.findIndex((x) => x > levels.gridA[j]!);
		expect(plot.wavefunctions[0]![mid]).toBeCloseTo(levels.wavefunctions[0]![j]!, 1);
	});
});

describe('tunnelling request bounds', () => {
	it('refuses a barrier of 0 (a flat quartic confines nothing), naming the field', () => {
		const parsed = tunnellingRequestSchema.safeParse({ potential: wellOf(0, 0.35) });
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues[0]?.path).toEqual(['potential', 'barrierKcalMol']);
	});
	it('wants both ends of a given grid, or neither', () => {
		const parsed = tunnellingRequestSchema.safeParse({ potential: wellOf(6, 0.35), xMinA: -1 });
		expect(parsed.error?.issues[0]?.path).toEqual(['xMaxA']);
		expect(tunnellingRequestSchema.parse({ potential: wellOf(6, 0.35) }).points).toBeUndefined();
	});
});
