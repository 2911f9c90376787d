/*
 * An invented structure of known geometry, written awkwardly on purpose, for the structure tests
 * (unit, integration and end to end). Its groups fit the demo's hydrogenase-like complex
 * ("HylSL", seed/demo.ts) by chain and ligand residue numbers.
 *
 * Groups (heavy atoms, Å):             ligand within 3 Å
 *   1 SF4 S301    FE1 (0,0,0)  S1 (0,2,0)          CYS S17 SG (-2.3,0,0)
 *   2 F3S S302A   FE1 (10,0,0) S1 (9,2,0)          CYS S229 SG (12.3,0,0)   insertion code A
 *   3 SF4 S10000  FE1 (20,0,0) S1 (19,0,0) alt B   CYS S184 SG (22.3,0,0)   hybrid-36 "A000";
 *                 (S1 alt A at (18,0,0), occupancy 0.3 < B's 0.7: must be dropped)
 *   4 HEM M401    FE (20,20,0) NA (20,18,0) + H (20,17,0)  HIS M71 NE2 (20,20,2)  written as ATOM
 *   5 HEM M402    FE (40,20,0) NA (38,20,0)        HIS M85 NE2 (40,20,2)
 *   6 FMN X900    N5 (100,100,100)                  — (no FMN centre on the protein)
 *
 * Pairs within 25 Å, by hand (edge-to-edge = nearest heavy atoms; centre-to-centre = metals):
 *   1–2  S1–S1   |(9,2,0)−(0,2,0)| = 9        centres |(10,0,0)| = 10
 *   2–3  FE1–S1  |(19,0,0)−(10,0,0)| = 9      centres 10  (with alt A it would be 8)
 *   1–3  FE1–S1  19                            centres 20
 *   3–4  FE1–NA  |(20,18,0)−(20,0,0)| = 18    centres 20  (the H at 17.03 Å does not count)
 *   4–5  FE–NA   18                            centres 20
 *   2–4  S1–NA   √(11² + 16²) = √377 ≈ 19.4165 centres √(10² + 20²) = √500 ≈ 22.3607
 * Beyond 25 Å: 1–4 (√656 ≈ 25.61), 3–5 (√(18² + 20²) ≈ 26.9) and every pair with 6.
 */

type Xyz = [number, number, number];

/** One ATOM/HETATM line in the fixed columns of PDB v3.3; `seq` is already 4 characters. */
function line(
	record: 'ATOM' | 'HETATM',
	serial: number,
	name: string,
	alt: string,
	resName: string,
	chain: string,
	seq: string,
	iCode: string,
	[x, y, z]: Xyz,
	occupancy: number,
	element: string
): string {
	return (
		record.padEnd(6) +
		String(serial).padStart(5) +
		' ' +
		name.padEnd(4) +
		(alt || ' ') +
		resName.padStart(3) +
		' ' +
		chain +
		seq.padStart(4) +
		(iCode || ' ') +
		'   ' +
		x.toFixed(3).padStart(8) +
		y.toFixed(3).padStart(8) +
		z.toFixed(3).padStart(8) +
		occupancy.toFixed(2).padStart(6) +
		' 20.00' +
		' '.repeat(10) +
		element.padStart(2)
	);
}

export const STRUCTURE_PDB = [
	'HEADER    INVENTED TEST STRUCTURE FOR HOPLINE',
	'REMARK   1 ATOM NAMES ALIGNED AS V3.3; SOME ELEMENT COLUMNS LEFT BLANK ON PURPOSE',
	line('ATOM', 1, ' SG ', '', 'CYS', 'S', '17', '', [-2.3, 0, 0], 1, 'S'),
	line('HETATM', 2, 'FE1 ', '', 'SF4', 'S', '301', '', [0, 0, 0], 1, ''),
	line('HETATM', 3, ' S1 ', '', 'SF4', 'S', '301', '', [0, 2, 0], 1, 'S'),
	line('ATOM', 4, ' SG ', '', 'CYS', 'S', '229', '', [12.3, 0, 0], 1, 'S'),
	line('HETATM', 5, 'FE1 ', '', 'F3S', 'S', '302', 'A', [10, 0, 0], 1, 'FE'),
	line('HETATM', 6, ' S1 ', '', 'F3S', 'S', '302', 'A', [9, 2, 0], 1, 'S'),
	line('ATOM', 7, ' SG ', '', 'CYS', 'S', '184', '', [22.3, 0, 0], 1, 'S'),
	line('HETATM', 8, 'FE1 ', '', 'SF4', 'S', 'A000', '', [20, 0, 0], 1, 'FE'),
	line('HETATM', 9, ' S1 ', 'A', 'SF4', 'S', 'A000', '', [18, 0, 0], 0.3, 'S'),
	line('HETATM', 10, ' S1 ', 'B', 'SF4', 'S', 'A000', '', [19, 0, 0], 0.7, 'S'),
	line('ATOM', 11, ' NE2', '', 'HIS', 'M', '71', '', [20, 20, 2], 1, 'N'),
	line('ATOM', 12, 'FE  ', '', 'HEM', 'M', '401', '', [20, 20, 0], 1, 'FE'),
	line('ATOM', 13, ' NA ', '', 'HEM', 'M', '401', '', [20, 18, 0], 1, 'N'),
	line('ATOM', 14, ' HA ', '', 'HEM', 'M', '401', '', [20, 17, 0], 1, 'H'),
	line('ATOM', 15, ' NE2', '', 'HIS', 'M', '85', '', [40, 20, 2], 1, 'N'),
	line('HETATM', 16, 'FE  ', '', 'HEM', 'M', '402', '', [40, 20, 0], 1, 'FE'),
	line('HETATM', 17, ' NA ', '', 'HEM', 'M', '402', '', [38, 20, 0], 1, 'N'),
	line('HETATM', 18, ' N5 ', '', 'FMN', 'X', '900', '', [100, 100, 100], 1, 'N'),
	line('HETATM', 19, ' O  ', '', 'HOH', 'S', '950', '', [1, 1, 1], 1, 'O'),
	'END',
	''
].join('\r\n');

/** The same groups as mmCIF: quoted values, '?' and '.' placeholders, a value split over lines. */
export const STRUCTURE_CIF = [
	'data_INVENTED',
	'#',
	'loop_',
	'_atom_site.group_PDB',
	'_atom_site.id',
	'_atom_site.type_symbol',
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
	'_atom_site.pdbx_PDB_model_num',
	'ATOM 1 S SG . CYS S 17 ? -2.3 0 0 1 1',
	"HETATM 2 FE 'FE1' . SF4 S 301 ? 0 0 0 1 1",
	'HETATM 3 S "S1" . SF4 S 301 ? 0 2 0 1 1',
	'ATOM 4 S SG . CYS S 229 ? 12.3 0 0 1 1',
	'HETATM 5 FE FE1 . F3S S 302 A 10 0 0 1 1',
	'HETATM 6 S S1 . F3S S 302 A 9 2 0 1 1',
	'ATOM 7 S SG . CYS S 184 ? 22.3 0 0 1 1',
	'HETATM 8 FE FE1 . SF4 S 10000 ? 20 0 0 1 1',
	'HETATM 9 S S1 A SF4 S 10000 ? 18 0 0 0.3 1',
	'HETATM 10 S S1 B SF4 S 10000 ? 19 0 0 0.7 1',
	'ATOM 11 N NE2 . HIS M 71 ? 20 20 2 1 1',
	'ATOM 12 FE FE . HEM M 401 ? 20 20 0 1 1',
	'ATOM 13 N NA . HEM M 401 ? 20 18 0 1 1',
	'ATOM 14 H HA . HEM M 401 ? 20 17 0 1 1',
	'ATOM 15 N NE2 . HIS M 85 ? 40 20 2 1 1',
	'HETATM 16 FE FE . HEM M 402 ? 40 20 0 1 1',
	'HETATM 17 N NA . HEM M 402 ? 38 20 0',
	'1 1',
	'HETATM 18 N N5 . FMN X 900 ? 100 100 100 1 1',
	'#',
	''
].join('\n');

/** The pairs within 25 Å, as computed by hand above: [group a, group b, edge Å, atoms, centre Å]. */
export const EXPECTED_PAIRS: [string, string, number, string, number][] = [
	['SF4 S301', 'F3S S302A', 9, 'S1–S1', 10],
	['F3S S302A', 'SF4 S10000', 9, 'FE1–S1', 10],
	['SF4 S10000', 'HEM M401', 18, 'FE1–NA', 20],
	['HEM M401', 'HEM M402', 18, 'FE–NA', 20],
	['SF4 S301', 'SF4 S10000', 19, 'FE1–S1', 20],
	['F3S S302A', 'HEM M401', Math.sqrt(377), 'S1–NA', Math.sqrt(500)]
];
