import { describe, expect, it } from 'vitest';
import {
	allCofactorDistances,
	centreToCentreDistance,
	cofactorGroups,
	edgeToEdgeDistance,
	elementFromPdbName,
	parseStructure,
	readHybrid36
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
	it('keeps one alternate location (equal occupancies: A)', () =>
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

/**
 * One ATOM/HETATM line written column by column (wwPDB format v3.3, ATOM record): the atom name
 * exactly as its four columns 13–16 hold it, the residue number as the text of columns 23–26.
 */
function rawPdbLine(o: {
	record?: 'ATOM' | 'HETATM';
	nameColumns: string;
	altLoc?: string;
	resName: string;
	chain?: string;
	resSeq: string;
	iCode?: string;
	xyz?: [number, number, number];
	occupancy?: string;
	element?: string;
}): string {
	const [x, y, z] = o.xyz ?? [0, 0, 0];
	const line =
		(o.record ?? 'HETATM').padEnd(6) +
		'    1' +
		' ' +
		o.nameColumns +
		(o.altLoc ?? ' ') +
		o.resName.padStart(3) +
		' ' +
		(o.chain ?? 'A') +
		o.resSeq.padStart(4) +
		(o.iCode ?? ' ') +
		'   ' +
		x.toFixed(3).padStart(8) +
		y.toFixed(3).padStart(8) +
		z.toFixed(3).padStart(8) +
		(o.occupancy ?? '  1.00').padStart(6) +
		' 20.00' +
		' '.repeat(10) +
		(o.element ?? '  ').padStart(2);
	expect(line.slice(12, 16)).toBe(o.nameColumns);
	expect(line.slice(22, 26)).toBe(o.resSeq.padStart(4));
	return line;
}

describe('element from the atom name when the element column is blank (PDB v3.3, ATOM: atom names)', () => {
	// v3.3: a one-letter element is right-aligned in columns 13–14, i.e. starts in column 14;
	// a two-letter element starts in column 13.
	it('" CA " is an alpha carbon, "CA  " is calcium', () => {
		expect(elementFromPdbName(' CA ')).toBe('C');
		expect(elementFromPdbName('CA  ')).toBe('CA');
		const atoms = parseStructure(
			[
				rawPdbLine({ record: 'ATOM', nameColumns: ' CA ', resName: 'ALA', resSeq: '5' }),
				rawPdbLine({ nameColumns: 'CA  ', resName: 'CA', resSeq: '401' })
			].join('\n')
		);
		expect(atoms.map((a) => a.element)).toEqual(['C', 'CA']);
	});
	it('"FE1 " of a cluster is iron, " SG " sulfur, " N1 " nitrogen', () => {
		expect(elementFromPdbName('FE1 ')).toBe('FE');
		expect(elementFromPdbName(' SG ')).toBe('S');
		expect(elementFromPdbName(' N1 ')).toBe('N');
	});
	it('four-column hydrogen names are hydrogens, not mercury ("HG12") or holmium ("HO2\'")', () => {
		expect(elementFromPdbName('HG12')).toBe('H');
		expect(elementFromPdbName("HO2'")).toBe('H');
		expect(elementFromPdbName('1HG1')).toBe('H');
		// Mercury as an ion: "HG  " starts in column 13 and does not fill all four.
		expect(elementFromPdbName('HG  ')).toBe('HG');
	});
	it('the element column wins when it is filled', () => {
		const [atom] = parseStructure(
			rawPdbLine({ nameColumns: 'CA  ', resName: 'XYZ', resSeq: '1', element: ' C' })
		);
		expect(atom?.element).toBe('C');
	});
});

describe('hybrid-36 residue numbers (Grosse-Kunstleve, Terwilliger & Adams, hybrid-36)', () => {
	// The specification's examples for width 4: decimal up to 9999, then "A000" = 10000,
	// "ZZZZ" = 10000 + 26·36³ − 1 = 1 223 055, "a000" = 1 223 056.
	it('reads decimal, upper-case and lower-case ranges', () => {
		expect(readHybrid36('9999', 4)).toBe(9999);
		expect(readHybrid36('-999', 4)).toBe(-999);
		expect(readHybrid36('A000', 4)).toBe(10000);
		expect(readHybrid36('A001', 4)).toBe(10001);
		expect(readHybrid36('A00Z', 4)).toBe(10035);
		expect(readHybrid36('A010', 4)).toBe(10036);
		expect(readHybrid36('ZZZZ', 4)).toBe(1223055);
		expect(readHybrid36('a000', 4)).toBe(1223056);
		expect(readHybrid36('zzzz', 4)).toBe(2436111);
		// Width 5 (atom serials): "A0000" = 100000.
		expect(readHybrid36('A0000', 5)).toBe(100000);
	});
	it('refuses mixed case and short codes', () => {
		expect(() => readHybrid36('A0a0', 4)).toThrow(RangeError);
		expect(() => readHybrid36('A00', 4)).toThrow(RangeError);
		expect(() => readHybrid36('1A00', 4)).toThrow(RangeError);
	});
	it('a cofactor numbered beyond 9999 keeps its number', () => {
		const atoms = parseStructure(
			[
				rawPdbLine({ nameColumns: 'FE1 ', resName: 'SF4', resSeq: '9999', element: 'FE' }),
				rawPdbLine({ nameColumns: 'FE1 ', resName: 'SF4', resSeq: 'A001', element: 'FE' })
			].join('\n')
		);
		expect(cofactorGroups(atoms).map((g) => g.label)).toEqual(['SF4 A9999', 'SF4 A10001']);
	});
	it('names the line of a residue number that is neither', () =>
		expect(() =>
			parseStructure(rawPdbLine({ nameColumns: 'FE1 ', resName: 'SF4', resSeq: '1x' }))
		).toThrow(/line 1: residue number "1x"/));
});

describe('insertion codes (PDB v3.3, ATOM: iCode, column 27)', () => {
	it('two cofactors at 101 and 101A are two groups, labelled apart', () => {
		const groups = cofactorGroups(
			parseStructure(
				[
					rawPdbLine({ nameColumns: 'FE1 ', resName: 'SF4', resSeq: '101', element: 'FE' }),
					rawPdbLine({
						nameColumns: 'FE1 ',
						resName: 'SF4',
						resSeq: '101',
						iCode: 'A',
						xyz: [10, 0, 0],
						element: 'FE'
					})
				].join('\n')
			)
		);
		expect(groups.map((g) => [g.label, g.insertionCode])).toEqual([
			['SF4 A101', ''],
			['SF4 A101A', 'A']
		]);
	});
});

describe('alternate locations (PDB v3.3, ATOM: altLoc and occupancy)', () => {
	const heme = (altLoc: string, occupancy: string, x: number) =>
		rawPdbLine({
			nameColumns: 'FE  ',
			altLoc,
			resName: 'HEM',
			resSeq: '201',
			xyz: [x, 0, 0],
			occupancy,
			element: 'FE'
		});
	it('keeps the conformer of highest occupancy, not the first met', () => {
		const atoms = parseStructure([heme('A', '0.30', 1), heme('B', '0.70', 2)].join('\n'));
		expect(atoms.map((a) => [a.altLoc, a.x])).toEqual([['B', 2]]);
	});
	it('on equal occupancy keeps A, wherever it comes', () => {
		const atoms = parseStructure([heme('B', '0.50', 2), heme('A', '0.50', 1)].join('\n'));
		expect(atoms.map((a) => a.altLoc)).toEqual(['A']);
	});
	it('chooses per residue, keeping atoms without an alternate location', () => {
		const atoms = parseStructure(
			[
				rawPdbLine({ nameColumns: ' NA ', resName: 'HEM', resSeq: '201', element: 'N' }),
				heme('A', '0.40', 1),
				heme('B', '0.60', 2),
				rawPdbLine({
					nameColumns: ' NB ',
					altLoc: 'A',
					resName: 'HEM',
					resSeq: '201',
					occupancy: '0.40',
					element: 'N'
				}),
				rawPdbLine({
					nameColumns: ' NB ',
					altLoc: 'B',
					resName: 'HEM',
					resSeq: '201',
					occupancy: '0.60',
					xyz: [5, 5, 5],
					element: 'N'
				})
			].join('\n')
		);
		expect(atoms.map((a) => `${a.name}${a.altLoc}`)).toEqual(['NA', 'FEB', 'NBB']);
	});
});

describe('mmCIF without _atom_site.group_PDB (PDBx/mmCIF dictionary: group_PDB is optional)', () => {
	const cif = [
		'data_NOGROUP',
		'loop_',
		'_atom_site.id',
		'_atom_site.label_atom_id',
		'_atom_site.label_alt_id',
		'_atom_site.label_comp_id',
		'_atom_site.auth_asym_id',
		'_atom_site.auth_seq_id',
		'_atom_site.pdbx_PDB_ins_code',
		'_atom_site.Cartn_x',
		'_atom_site.Cartn_y',
		'_atom_site.Cartn_z',
		'_atom_site.occupancy',
		'1 FE1 . SF4 A 101 . 0 0 0 1.00',
		'2 FE2 . SF4 A 101 . 2 0 0 1.00',
		'3 FE1 . SF4 A 101 B 9 0 0 1.00',
		'4 CA . CA A 401 ? 5 5 5 1.00',
		'5 CA . ALA A 5 ? 7 7 7 1.00',
		'6 FE A HEM B 201 ? 20 0 0 0.25',
		'7 FE B HEM B 201 ? 21 0 0 0.75',
		'#'
	].join('\n');
	const atoms = parseStructure(cif);
	it('reads every row, and says the record type is not stated', () => {
		expect(atoms).toHaveLength(6);
		expect(atoms.every((a) => a.hetero === null)).toBe(true);
	});
	it('guesses elements from names without type_symbol: CA in CA is calcium, in ALA carbon', () =>
		expect(atoms.map((a) => a.element)).toEqual(['FE', 'FE', 'FE', 'CA', 'C', 'FE']));
	it('keeps insertion codes in group labels and the better occupied heme conformer', () => {
		const groups = cofactorGroups(atoms);
		expect(groups.map((g) => g.label)).toEqual(['SF4 A101', 'SF4 A101B', 'HEM B201']);
		expect(groups[2]!.atoms.map((a) => a.x)).toEqual([21]);
	});
	it('still needs coordinates', () =>
		expect(() => parseStructure(cif.replace('_atom_site.Cartn_z\n', ''))).toThrow(
			/lacks _atom_site.Cartn_z/
		));
});
