import { describe, expect, it } from 'vitest';
import {
	allCofactorDistances,
	centreToCentreDistance,
	cofactorGroups,
	edgeToEdgeDistance,
	parseStructure
} from '$lib/science';

/** One ATOM/HETATM line in the fixed columns of the wwPDB format description v3.3. */
function pdbLine(
	record: 'ATOM' | 'HETATM',
	serial: number,
	name: string,
	resName: string,
	chain: string,
	resSeq: number,
	[x, y, z]: [number, number, number],
	element: string,
	altLoc = ' '
): string {
	const atomName = name.length < 4 && element.length === 1 ? ` ${name}`.padEnd(4) : name.padEnd(4);
	return (
		record.padEnd(6) +
		String(serial).padStart(5) +
		' ' +
		atomName +
		altLoc +
		resName.padStart(3) +
		' ' +
		chain +
		String(resSeq).padStart(4) +
		' ' +
		'   ' +
		x.toFixed(3).padStart(8) +
		y.toFixed(3).padStart(8) +
		z.toFixed(3).padStart(8) +
		'  1.00' +
		' 20.00' +
		' '.repeat(10) +
		element.padStart(2)
	);
}

// Invented coordinates: two [4Fe-4S] clusters whose nearest atoms are 3-4-5 apart, a heme, a
// cysteine, two waters, an alternate location and a second model that must be ignored.
const cluster = (chain: string, seq: number, at: [number, number, number], first: number) => [
	pdbLine('HETATM', first, 'FE1', 'SF4', chain, seq, at, 'FE'),
	pdbLine('HETATM', first + 1, 'FE2', 'SF4', chain, seq, [at[0] + 2, at[1], at[2]], 'FE'),
	pdbLine('HETATM', first + 2, 'S1', 'SF4', chain, seq, [at[0], at[1] + 2, at[2]], 'S'),
	pdbLine('HETATM', first + 3, 'S2', 'SF4', chain, seq, [at[0] + 2, at[1] + 2, at[2]], 'S')
];
const PDB = [
	'HEADER    INVENTED TEST STRUCTURE',
	'MODEL        1',
	pdbLine('ATOM', 1, 'SG', 'CYS', 'A', 12, [-3, 0, 0], 'S'),
	...cluster('A', 101, [0, 0, 0], 2),
	...cluster('A', 102, [5, 6, 0], 6), // nearest pair: (2,2,0) → (5,6,0) = 5 Å
	pdbLine('HETATM', 10, 'FE', 'HEM', 'B', 201, [20, 0, 0], 'FE'),
	pdbLine('HETATM', 11, 'NA', 'HEM', 'B', 201, [18, 0, 0], 'N', 'A'),
	pdbLine('HETATM', 12, 'NA', 'HEM', 'B', 201, [17, 0, 0], 'N', 'B'),
	pdbLine('HETATM', 13, 'O', 'HOH', 'A', 301, [2, 2, 1], 'O'),
	pdbLine('HETATM', 14, 'O', 'HOH', 'A', 302, [10, 10, 10], 'O'),
	'ENDMDL',
	'MODEL        2',
	pdbLine('HETATM', 15, 'FE', 'HEM', 'B', 201, [99, 0, 0], 'FE'),
	'ENDMDL',
	'END'
].join('\n');

describe('parseStructure (PDB)', () => {
	const atoms = parseStructure(PDB);
	it('reads the first model only', () => expect(atoms.some((a) => a.x === 99)).toBe(false));
	it('keeps the first alternate location only', () =>
		expect(atoms.filter((a) => a.resName === 'HEM' && a.name === 'NA').map((a) => a.x)).toEqual([
			18
		]));
	it('reads names, residues, chains and elements from fixed columns', () => {
		const fe = atoms.find((a) => a.resName === 'SF4' && a.name === 'FE2' && a.resSeq === 102);
		expect(fe).toMatchObject({ element: 'FE', chainId: 'A', x: 7, y: 6, z: 0, hetero: true });
	});
	it('names the line of a malformed coordinate', () =>
		expect(() =>
			parseStructure(
				pdbLine('HETATM', 1, 'FE', 'HEM', 'A', 1, [0, 0, 0], 'FE').replace('   0.000', '   x.xxx')
			)
		).toThrow(/line 1: x/));
	it('refuses text without atoms', () =>
		expect(() => parseStructure('HEADER nothing here')).toThrow(/no ATOM or HETATM/));
});

describe('cofactor groups and distances', () => {
	const groups = cofactorGroups(parseStructure(PDB));
	it('groups cofactor atoms by residue and skips waters and amino acids', () => {
		expect(groups.map((g) => `${g.resName} ${g.chainId}${g.resSeq}`)).toEqual([
			'SF4 A101',
			'SF4 A102',
			'HEM B201'
		]);
		expect(groups[0]!.family).toBe('iron–sulfur cluster');
		expect(groups[2]!.family).toBe('heme');
	});
	it('edge-to-edge is the nearest heavy-atom distance', () =>
		expect(edgeToEdgeDistance(groups[0]!, groups[1]!)).toBeCloseTo(5, 12));
	it('centre-to-centre joins the iron centroids', () =>
		// Centroids (1,0,0) and (6,6,0): √(25 + 36).
		expect(centreToCentreDistance(groups[0]!, groups[1]!)).toBeCloseTo(Math.sqrt(61), 12));
	it('lists every pair, nearest first', () => {
		const pairs = allCofactorDistances(groups);
		expect(pairs).toHaveLength(3);
		expect(pairs[0]!.edgeToEdgeA).toBeCloseTo(5, 12);
		expect(pairs.map((p) => p.edgeToEdgeA)).toEqual(
			[...pairs.map((p) => p.edgeToEdgeA)].sort((a, b) => a - b)
		);
	});
});

describe('parseStructure (mmCIF)', () => {
	const cif = [
		'data_INVENTED',
		'#',
		'loop_',
		'_atom_site.group_PDB',
		'_atom_site.id',
		'_atom_site.type_symbol',
		'_atom_site.label_atom_id',
		'_atom_site.label_alt_id',
		'_atom_site.label_comp_id',
		'_atom_site.label_asym_id',
		'_atom_site.label_seq_id',
		'_atom_site.Cartn_x',
		'_atom_site.Cartn_y',
		'_atom_site.Cartn_z',
		'_atom_site.auth_seq_id',
		'_atom_site.auth_asym_id',
		'_atom_site.pdbx_PDB_model_num',
		'HETATM 1 FE FE1 . SF4 C . 0 0 0 101 A 1',
		'HETATM 2 FE FE2 . SF4 C . 2 0 0 101 A 1',
		'HETATM 3 S  S1  . SF4 C . 0 2 0 101 A 1',
		'HETATM 4 FE FE1 . SF4 D . 5 6 0 102 A 1',
		'HETATM 5 FE FE2 . SF4 D . 7 6 0 102 A 1',
		'HETATM 6 O  O   . HOH E . 1 1 1 301 A 1',
		'HETATM 7 FE FE1 . SF4 C . 50 0 0 101 A 2',
		'#'
	].join('\n');
	it('reads the atom_site loop with author numbering and the first model', () => {
		const atoms = parseStructure(cif);
		expect(atoms).toHaveLength(6);
		expect(atoms[0]).toMatchObject({ resName: 'SF4', chainId: 'A', resSeq: 101, element: 'FE' });
		const groups = cofactorGroups(atoms);
		expect(groups).toHaveLength(2);
		// Nearest pair: S1 (0,2,0) and FE1 (5,6,0).
		expect(edgeToEdgeDistance(groups[0]!, groups[1]!)).toBeCloseTo(Math.hypot(5, 4), 12);
	});
	it('reads quoted values', () => {
		const quoted = cif.replace('HETATM 6 O  O   . HOH E', "HETATM 6 O  'O' . HOH E");
		expect(parseStructure(quoted).find((a) => a.resName === 'HOH')?.name).toBe('O');
	});
});
