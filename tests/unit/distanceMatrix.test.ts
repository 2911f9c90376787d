import { describe, expect, it } from 'vitest';
import { distanceMatrix, reachBin } from '$lib/catalogue/distanceMatrix';

describe('distanceMatrix', () => {
	const centres = ['A', 'B', 'C', 'D'].map((l) => ({ accession: `HL00000${l}`, label: l }));
	const d = (a: string, b: string, edgeToEdgeAngstrom: number, structureId = 'S1') => ({
		accession: `D${a}${b}${structureId}`,
		centreA: { accession: `HL00000${a}` },
		centreB: { accession: `HL00000${b}` },
		edgeToEdgeAngstrom,
		structureId
	});
	const m = distanceMatrix(centres, [d('A', 'B', 9.8), d('B', 'A', 9.1, 'S2'), d('B', 'C', 14.2)]);
	it('leaves out centres without distances and fills both halves', () => {
		expect(m.centres.map((c) => c.label)).toEqual(['A', 'B', 'C']);
		expect(m.cells[0]![1]).toBe(m.cells[1]![0]);
		expect(m.cells[0]![0]).toBeNull();
		expect(m.cells[0]![2]).toBeNull();
	});
	it('keeps the shortest value over structures and marks hops within 14 Å', () => {
		expect(m.cells[0]![1]).toMatchObject({ edgeToEdgeA: 9.1, structureId: 'S2', hop: true });
		expect(m.cells[1]![2]).toMatchObject({ hop: false, bin: 5 - 1 });
	});
	it('bins by the scale’s edges (8, 11, 14, 20 Å; bin edges inclusive)', () =>
		expect([0, 8, 8.01, 11, 14, 14.01, 20, 20.5].map(reachBin)).toEqual([1, 1, 2, 2, 3, 4, 4, 5]));
});
