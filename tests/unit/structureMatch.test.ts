import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import {
	closestHeavyAtoms,
	cofactorGroups,
	kindsForResidue,
	ligandResidues,
	pairsWithinCutoff,
	parseStructure,
	proposeMatches,
	type CentreToMatch
} from '$lib/science';
import { isGzip, readStructureFile } from '$lib/server/structures/readStructureFile';
import { EXPECTED_PAIRS, STRUCTURE_CIF, STRUCTURE_PDB } from '../support/structureFixture';

// The oracle for every distance below is the hand computation in tests/support/structureFixture.ts.
for (const [format, text] of [
	['PDB', STRUCTURE_PDB],
	['mmCIF', STRUCTURE_CIF]
] as const) {
	describe(`structure pairs from the invented ${format} file`, () => {
		const atoms = parseStructure(text);
		const groups = cofactorGroups(atoms);

		it('lists the six cofactor groups with insertion code and hybrid-36 number', () =>
			expect(groups.map((g) => g.label)).toEqual([
				'SF4 S301',
				'F3S S302A',
				'SF4 S10000',
				'HEM M401',
				'HEM M402',
				'FMN X900'
			]));

		it('keeps the pairs within 25 Å, nearest first, naming the two closest heavy atoms', () => {
			const pairs = pairsWithinCutoff(groups);
			expect(pairs).toHaveLength(EXPECTED_PAIRS.length);
			pairs.forEach((p, i) => {
				const [a, b, edge, atomNames, centre] = EXPECTED_PAIRS[i]!;
				expect([groups[p.a]!.label, groups[p.b]!.label]).toEqual([a, b]);
				expect(p.edge.distanceA).toBeCloseTo(edge, 10);
				expect(`${p.edge.atomA.name}–${p.edge.atomB.name}`).toBe(atomNames);
				expect(p.centreToCentreA).toBeCloseTo(centre, 10);
			});
		});

		it('finds each group’s ligand residues within 3 Å', () =>
			expect(groups.map((g) => ligandResidues(g, atoms).map((l) => l.chainId + l.resSeq))).toEqual([
				['S17'],
				['S229'],
				['S184'],
				['M71'],
				['M85'],
				[]
			]));

		it('proposes the demo complex’s centres by kind, chain and ligands', () => {
			const centres: CentreToMatch[] = [
				{ id: 'nife', cofactorKind: 'nife', chainId: 'L', residues: [65, 68, 530, 533] },
				{ id: 'prox', cofactorKind: 'fe4s4', chainId: 'S', residues: [17, 20, 114, 148] },
				{ id: 'med', cofactorKind: 'fe3s4', chainId: 'S', residues: [229, 247, 250] },
				{ id: 'dist', cofactorKind: 'fe4s4', chainId: 'S', residues: [184, 187, 212, 218] },
				{ id: 'b1', cofactorKind: 'heme_b', chainId: 'M', residues: [71, 186] },
				{ id: 'b2', cofactorKind: 'heme_b', chainId: 'M', residues: [85, 200] }
			];
			const ligands = groups.map((g) => ligandResidues(g, atoms));
			expect(proposeMatches(groups, ligands, centres).map((m) => m.centreId)).toEqual([
				'prox',
				'med',
				'dist',
				'b1',
				'b2',
				null
			]);
		});
	});
}

describe('pairsWithinCutoff', () => {
	const groups = cofactorGroups(parseStructure(STRUCTURE_PDB));
	it('takes a cutoff: 9 Å keeps the two 9 Å pairs only (hand computation above)', () =>
		expect(pairsWithinCutoff(groups, { cutoffA: 9 })).toHaveLength(2));
	it('keeps 1–4 at 26 Å (√656 ≈ 25.61 by hand) and drops it at 25 Å', () => {
		const has14 = (cutoffA: number) =>
			pairsWithinCutoff(groups, { cutoffA }).some((p) => p.a === 0 && p.b === 3);
		expect([has14(25), has14(26)]).toEqual([false, true]);
	});
	it('refuses a cutoff that is not a positive number', () => {
		expect(() => pairsWithinCutoff(groups, { cutoffA: 0 })).toThrow(RangeError);
		expect(() => pairsWithinCutoff(groups, { cutoffA: Number.NaN })).toThrow(/positive/);
	});
});

describe('closestHeavyAtoms', () => {
	const groups = cofactorGroups(parseStructure(STRUCTURE_PDB));
	it('ignores hydrogens: HEM M401’s HA is 17.03 Å from SF4 S10000, its NA 18 Å', () => {
		const c = closestHeavyAtoms(groups[2]!, groups[3]!);
		expect(c.distanceA).toBeCloseTo(18, 12);
		expect(c.atomB).toEqual({ name: 'NA', element: 'N', group: 'HEM M401' });
	});
	it('names the group without heavy atoms', () => {
		const bare = { ...groups[0]!, label: 'SF4 Z1', atoms: [] };
		expect(() => closestHeavyAtoms(bare, groups[1]!)).toThrow(/SF4 Z1 has no heavy atoms/);
	});
});

describe('proposeMatches', () => {
	const groups = cofactorGroups(parseStructure(STRUCTURE_PDB));
	const noLigands = groups.map(() => []);
	it('matches the group’s own residue number first', () => {
		const m = proposeMatches(groups, noLigands, [
			{ id: 'fmn', cofactorKind: 'fmn', chainId: 'X', residues: [900] }
		]);
		expect(m[5]).toEqual({ group: 5, centreId: 'fmn', basis: 'residue' });
	});
	it('proposes by kind only when one group and one centre of the kind are left', () => {
		const m = proposeMatches(groups, noLigands, [
			{ id: 'f3s', cofactorKind: 'fe3s4', chainId: null, residues: [] },
			{ id: 'a', cofactorKind: 'fe4s4', chainId: null, residues: [] }
		]);
		expect(m[1]).toEqual({ group: 1, centreId: 'f3s', basis: 'kind' });
		// Two SF4 groups for one [4Fe-4S] centre: ambiguous, nothing proposed.
		expect([m[0]!.centreId, m[2]!.centreId]).toEqual([null, null]);
	});
	it('never matches across chains', () => {
		const m = proposeMatches(groups, noLigands, [
			{ id: 'x', cofactorKind: 'fmn', chainId: 'Y', residues: [900] },
			{ id: 'y', cofactorKind: 'fmn', chainId: 'Z', residues: [] }
		]);
		expect(m[5]!.centreId).toBeNull();
	});
	it('maps residue names to kinds (wwPDB Chemical Component Dictionary names)', () => {
		expect(kindsForResidue('HEC')).toEqual(['heme_c']);
		expect(kindsForResidue('sf4')).toEqual(['fe4s4', 'fe4s4_hipip']);
		expect(kindsForResidue('XYZ')).toEqual(['other']);
	});
});

describe('readStructureFile', () => {
	const limits = { maxBytes: 10_000, maxTextBytes: 20_000 };
	const bytes = new TextEncoder().encode(STRUCTURE_PDB);
	it('reads plain text and keeps the SHA-256 of the bytes', async () => {
		const f = await readStructureFile(bytes, limits);
		expect(f.text).toBe(STRUCTURE_PDB);
		expect(f.gzipped).toBe(false);
		expect(f.sha256).toMatch(/^[0-9a-f]{64}$/);
	});
	it('recognises gzip by its magic number and unpacks it', async () => {
		const gz = gzipSync(bytes);
		expect(isGzip(gz)).toBe(true);
		const f = await readStructureFile(gz, limits);
		expect(f.text).toBe(STRUCTURE_PDB);
		expect(f.gzipped).toBe(true);
	});
	it('refuses a gzip bomb past the unpacked limit without unpacking all of it', async () => {
		const bomb = gzipSync(Buffer.alloc(5_000_000, 0x20));
		expect(bomb.length).toBeLessThan(limits.maxBytes);
		await expect(readStructureFile(bomb, limits)).rejects.toMatchObject({
			code: 'payload_too_large',
			message: expect.stringMatching(/unpacks to more than/)
		});
	});
	it('refuses empty, oversized, broken gzip and binary files with their reason', async () => {
		await expect(readStructureFile(new Uint8Array(), limits)).rejects.toThrow(/empty/);
		await expect(readStructureFile(new Uint8Array(10_001), limits)).rejects.toThrow(/limit/);
		await expect(readStructureFile(Uint8Array.of(0x1f, 0x8b, 1, 2, 3), limits)).rejects.toThrow(
			/could not be unpacked/
		);
		await expect(readStructureFile(Uint8Array.of(0xff, 0xfe, 0), limits)).rejects.toThrow(
			/not text/
		);
	});
});
