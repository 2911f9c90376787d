/*
 * Reading atoms from PDB and PDBx/mmCIF coordinate files, grouping cofactor atoms into redox
 * centres, and measuring edge-to-edge and centre-to-centre distances between them (Å).
 *
 * References: wwPDB, *Atomic Coordinate Entry Format Description*, v3.3 (2011), section
 * "Coordinate Section", records ATOM and HETATM (fixed columns; atom-name alignment); wwPDB
 * PDBx/mmCIF dictionary, category atom_site; R. W. Grosse-Kunstleve, T. C. Terwilliger & P. D.
 * Adams, "hybrid-36" (cctbx, 2007), the encoding of residue numbers beyond 9999 in the PDB
 * format's 4 columns; residue names from the wwPDB Chemical Component Dictionary (listed in
 * COFACTOR_RESIDUES).
 *
 * Choices, each with its reason:
 * - Only the first model is read (an NMR ensemble's first model stands for it).
 * - Alternate locations: per residue (chain, number, insertion code), the conformer with the
 *   highest mean occupancy is kept, ties going to "A", then to the alphabetically first
 *   identifier; atoms without an alternate location are always kept. The first location met
 *   is not necessarily the better determined one (PDB v3.3, ATOM: altLoc and occupancy).
 * - The element comes from the element column (PDB columns 77–78, mmCIF type_symbol); when it is
 *   blank it is read from the atom name's alignment (`elementFromPdbName`).
 * - mmCIF files need not carry _atom_site.group_PDB (the dictionary does not require it);
 *   without it every row of the first model is read and `hetero` is null (not stated).
 */

export interface Atom {
	/** Atom name, e.g. FE1, S2, N5. */
	name: string;
	/** Element symbol, upper case (from the element column, else guessed from the name). */
	element: string;
	resName: string;
	chainId: string;
	resSeq: number;
	insertionCode: string;
	x: number;
	y: number;
	z: number;
	/** HETATM (true) or ATOM (false); null when an mmCIF file has no group_PDB column. */
	hetero: boolean | null;
	/** Alternate location identifier ('' when none). */
	altLoc: string;
	/** Occupancy (0–1); null when the file gives none. */
	occupancy: number | null;
}

/** Cofactor residue names of the wwPDB Chemical Component Dictionary, by family. */
export const COFACTOR_RESIDUES: Record<string, readonly string[]> = {
	'iron–sulfur cluster': ['SF4', 'F3S', 'FES'],
	heme: ['HEM', 'HEC', 'HEA', 'HEB', 'HAS', 'DHE', 'SRM'],
	flavin: ['FMN', 'FAD', 'FDA'],
	quinone: ['UQ1', 'UQ2', 'U10', 'PL9', 'MQ7', 'MQ8', 'MQ9', 'PQN'],
	copper: ['CU', 'CU1', 'CUA'],
	'Mo/W-pterin': ['MGD', 'MTE', 'MO', 'W'],
	'[NiFe] site': ['NI', 'FCO']
};

const COFACTOR_NAMES = new Map(
	Object.entries(COFACTOR_RESIDUES).flatMap(([family, names]) =>
		names.map((n) => [n, family] as const)
	)
);
const WATER = new Set(['HOH', 'WAT', 'DOD', 'H2O']);
const METALS = new Set(['FE', 'CU', 'NI', 'MO', 'W', 'CO', 'MN', 'ZN', 'MG']);
const ISOALLOXAZINE = new Set([
	'N1',
	'C2',
	'N3',
	'C4',
	'C4A',
	'N5',
	'C5A',
	'C6',
	'C7',
	'C8',
	'C9',
	'C9A',
	'N10',
	'C10'
]);

/** Element symbols of two letters (IUPAC periodic table), upper case. */
const TWO_LETTER_ELEMENTS = new Set(
	(
		'HE LI BE NE NA MG AL SI CL AR CA SC TI CR MN FE CO NI CU ZN GA GE AS SE BR KR RB SR ZR NB ' +
		'MO TC RU RH PD AG CD IN SN SB TE XE CS BA LA CE PR ND PM SM EU GD TB DY HO ER TM YB LU HF ' +
		'TA RE OS IR PT AU HG TL PB BI PO AT RN FR RA AC TH PA NP PU AM CM BK CF ES FM MD NO LR'
	).split(' ')
);

/**
 * The element of a PDB atom whose element column is blank, from its 4-column name (columns
 * 13–16) as PDB v3.3 aligns it (ATOM record, "Atom names"): a one-letter element starts in
 * column 14 (" CA " is an alpha carbon), a two-letter element in column 13 ("CA  " is calcium,
 * "FE1 " iron). A digit in column 13 (old hydrogen names such as "1HG1") also means a one-letter
 * element in column 14. A name filling all four columns starts in column 13 whatever its
 * element; there, a name starting with H is a hydrogen ("HG12", "HD21": v3.3 writes four-letter
 * hydrogen names so), not mercury or another two-letter element.
 * @example elementFromPdbName(' CA ') // 'C'
 * @example elementFromPdbName('CA  ') // 'CA'
 */
export function elementFromPdbName(name: string): string {
	const columns = name.padEnd(4).slice(0, 4).toUpperCase();
	const first = columns[0]!;
	const second = columns[1]!;
	if (first === ' ' || /[0-9]/.test(first)) return /[A-Z]/.test(second) ? second : '';
	if (!/[A-Z]/.test(first)) return '';
	const fillsAll = columns[3] !== ' ';
	if (fillsAll && first === 'H') return 'H';
	if (/[A-Z]/.test(second) && TWO_LETTER_ELEMENTS.has(first + second)) return first + second;
	return first;
}

/**
 * The element of an mmCIF atom without type_symbol, from its name alone (mmCIF keeps no column
 * alignment): a single-atom component named as its element (CA in CA, FE in FE: the Chemical
 * Component Dictionary's ions) is that element; a name starting with a metal or halogen symbol
 * (FE1, CU, CL1) outside the standard amino acids is that element; otherwise the first letter.
 */
function elementFromCifName(name: string, resName: string): string {
	const upper = name.toUpperCase();
	if (upper === resName.toUpperCase() && TWO_LETTER_ELEMENTS.has(upper)) return upper;
	const letters = upper.replace(/[^A-Z]/g, '');
	if (!AMINO_ACIDS.has(resName.toUpperCase())) {
		for (const two of ['FE', 'CU', 'NI', 'MO', 'ZN', 'MG', 'MN', 'CO', 'CL', 'SE', 'BR']) {
			if (upper.startsWith(two)) return two;
		}
	}
	return letters.slice(0, 1);
}

/** The 20 standard amino acids and selenomethionine, whose atoms are C, N, O, S, Se or H. */
const AMINO_ACIDS = new Set(
	'ALA ARG ASN ASP CYS GLN GLU GLY HIS ILE LEU LYS MET PHE PRO SER THR TRP TYR VAL'.split(' ')
);

const DIGITS_UPPER = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ';
const DIGITS_LOWER = '0123456789abcdefghijklmnopqrstuvwxyz';

/**
 * Reads a hybrid-36 number of `width` characters (4 for residue numbers, 5 for atom serials):
 * plain decimal up to 10^width − 1; then upper-case base 36 starting at "A000" (= 10^width),
 * then lower-case base 36 starting at "a000" (Grosse-Kunstleve, Terwilliger & Adams, hybrid-36).
 * For width 4: "9999" → 9999, "A000" → 10000, "ZZZZ" → 1 223 055, "a000" → 1 223 056.
 * @throws {RangeError} for text that is neither decimal nor a valid hybrid-36 number.
 * @example readHybrid36('A001', 4) // 10001
 */
export function readHybrid36(text: string, width: number): number {
	const s = text.trim();
	if (s === '') throw new RangeError('empty number');
	if (/^-?\d+$/.test(s)) return Number(s);
	if (s.length !== width)
		throw new RangeError(`"${s}" is not a ${width}-character hybrid-36 number`);
	const upper = /^[A-Z][0-9A-Z]*$/.test(s);
	const lower = /^[a-z][0-9a-z]*$/.test(s);
	if (!upper && !lower) throw new RangeError(`"${s}" is not a hybrid-36 number`);
	const digits = upper ? DIGITS_UPPER : DIGITS_LOWER;
	let value = 0;
	for (const ch of s) value = value * 36 + digits.indexOf(ch);
	// "A000…" is 10·36^(width−1) in base 36 and stands for 10^width.
	const offset = 10 * 36 ** (width - 1);
	const span = 26 * 36 ** (width - 1);
	return value - offset + 10 ** width + (lower ? span : 0);
}

function number(text: string, what: string, line: number): number {
	const value = Number(text.trim());
	if (text.trim() === '' || !Number.isFinite(value)) {
		throw new RangeError(`line ${line}: ${what} "${text.trim()}" is not a number`);
	}
	return value;
}

/** An optional number (occupancy): null when blank or "?"/"."; the line named when malformed. */
function optionalNumber(text: string, what: string, line: number): number | null {
	const t = text.trim();
	if (t === '' || t === '?' || t === '.') return null;
	return number(t, what, line);
}

/**
 * Keeps, per residue, the atoms without an alternate location and those of one conformer: the
 * highest mean occupancy, then "A", then the alphabetically first identifier (see the module
 * notes). Order of the atoms is kept.
 */
function chooseAltLocs(atoms: Atom[]): Atom[] {
	const residueKey = (a: Atom) => `${a.chainId}|${a.resSeq}|${a.insertionCode}`;
	const stats = new Map<string, Map<string, { sum: number; known: number }>>();
	for (const a of atoms) {
		if (a.altLoc === '') continue;
		const key = residueKey(a);
		let byAlt = stats.get(key);
		if (!byAlt) stats.set(key, (byAlt = new Map()));
		const s = byAlt.get(a.altLoc) ?? { sum: 0, known: 0 };
		if (a.occupancy !== null) {
			s.sum += a.occupancy;
			s.known++;
		}
		byAlt.set(a.altLoc, s);
	}
	const chosen = new Map<string, string>();
	for (const [key, byAlt] of stats) {
		const ranked = [...byAlt].map(([alt, s]) => ({
			alt,
			mean: s.known > 0 ? s.sum / s.known : -Infinity
		}));
		ranked.sort(
			(p, q) =>
				q.mean - p.mean ||
				(p.alt === 'A' ? -1 : q.alt === 'A' ? 1 : 0) ||
				(p.alt < q.alt ? -1 : p.alt > q.alt ? 1 : 0)
		);
		chosen.set(key, ranked[0]!.alt);
	}
	return atoms.filter((a) => a.altLoc === '' || chosen.get(residueKey(a)) === a.altLoc);
}

function parsePdb(text: string): Atom[] {
	const atoms: Atom[] = [];
	let modelsSeen = 0;
	const lines = text.split(/\r?\n/);
	for (let i = 0; i < lines.length; i++) {
		const line = lines[i]!;
		const record = line.slice(0, 6).trim();
		if (record === 'MODEL') {
			modelsSeen++;
			if (modelsSeen > 1) break;
			continue;
		}
		if (record === 'ENDMDL' && modelsSeen > 0) break;
		if (record !== 'ATOM' && record !== 'HETATM') continue;
		// Columns of PDB v3.3, ATOM/HETATM: name 13–16, altLoc 17, resName 18–20, chainID 22,
		// resSeq 23–26 (hybrid-36 beyond 9999), iCode 27, x y z 31–54, occupancy 55–60,
		// element 77–78.
		const nameColumns = line.slice(12, 16);
		const name = nameColumns.trim();
		const resName = line.slice(17, 20).trim();
		const seqText = line.slice(22, 26);
		let resSeq: number;
		try {
			resSeq = readHybrid36(seqText, 4);
		} catch {
			throw new RangeError(`line ${i + 1}: residue number "${seqText.trim()}" is not a number`);
		}
		const element = line.slice(76, 78).trim().toUpperCase() || elementFromPdbName(nameColumns);
		atoms.push({
			name,
			element,
			resName,
			chainId: line.slice(21, 22).trim(),
			resSeq,
			insertionCode: line.slice(26, 27).trim(),
			x: number(line.slice(30, 38), 'x', i + 1),
			y: number(line.slice(38, 46), 'y', i + 1),
			z: number(line.slice(46, 54), 'z', i + 1),
			hetero: record === 'HETATM',
			altLoc: line.slice(16, 17).trim(),
			occupancy: optionalNumber(line.slice(54, 60), 'occupancy', i + 1)
		});
	}
	return chooseAltLocs(atoms);
}

/** Splits an mmCIF data line into tokens, honouring single and double quotes. */
function tokens(line: string): string[] {
	const out: string[] = [];
	const re = /'((?:[^']|'(?!\s|$))*)'(?=\s|$)|"((?:[^"]|"(?!\s|$))*)"(?=\s|$)|(\S+)/g;
	let m: RegExpExecArray | null;
	while ((m = re.exec(line)) !== null) out.push(m[1] ?? m[2] ?? m[3] ?? '');
	return out;
}

function parseMmcif(text: string): Atom[] {
	const lines = text.split(/\r?\n/);
	let i = 0;
	while (i < lines.length) {
		if (lines[i]!.trim() === 'loop_' && lines[i + 1]?.trim().startsWith('_atom_site.')) break;
		i++;
	}
	if (i >= lines.length) throw new RangeError('no atom_site loop in this mmCIF file');
	i++;
	const columns: string[] = [];
	while (i < lines.length && lines[i]!.trim().startsWith('_atom_site.')) {
		columns.push(lines[i]!.trim().slice('_atom_site.'.length).split(/\s/)[0]!);
		i++;
	}
	const col = (name: string) => columns.indexOf(name);
	// Only the coordinates and an atom name are indispensable; group_PDB is optional in the
	// PDBx/mmCIF dictionary and many programs leave it out.
	for (const r of ['Cartn_x', 'Cartn_y', 'Cartn_z'])
		if (col(r) < 0) throw new RangeError(`the atom_site loop lacks _atom_site.${r}`);
	if (col('auth_atom_id') < 0 && col('label_atom_id') < 0)
		throw new RangeError('the atom_site loop lacks _atom_site.label_atom_id (and auth_atom_id)');
	const hasGroup = col('group_PDB') >= 0;
	const pick = (row: string[], ...names: string[]) => {
		for (const n of names) {
			const c = col(n);
			if (c >= 0 && row[c] !== undefined && row[c] !== '?' && row[c] !== '.') return row[c]!;
		}
		return '';
	};
	const atoms: Atom[] = [];
	let firstModel: string | null = null;
	let pending: string[] = [];
	for (; i < lines.length; i++) {
		const line = lines[i]!;
		const trimmed = line.trim();
		if (trimmed === '') continue;
		if (
			trimmed === '#' ||
			trimmed === 'loop_' ||
			trimmed.startsWith('_') ||
			trimmed.startsWith('data_')
		)
			break;
		pending.push(...tokens(line));
		if (pending.length < columns.length) continue;
		if (pending.length > columns.length) {
			throw new RangeError(
				`line ${i + 1}: ${pending.length} values for ${columns.length} atom_site columns`
			);
		}
		const row = pending;
		pending = [];
		const model = pick(row, 'pdbx_PDB_model_num');
		if (firstModel === null) firstModel = model;
		if (model !== firstModel) break;
		const group = hasGroup ? pick(row, 'group_PDB') : null;
		if (group !== null && group !== 'ATOM' && group !== 'HETATM') continue;
		const name = pick(row, 'auth_atom_id', 'label_atom_id');
		const resName = pick(row, 'auth_comp_id', 'label_comp_id');
		const seqText = pick(row, 'auth_seq_id', 'label_seq_id');
		atoms.push({
			name,
			element: (pick(row, 'type_symbol') || elementFromCifName(name, resName)).toUpperCase(),
			resName,
			chainId: pick(row, 'auth_asym_id', 'label_asym_id'),
			resSeq: seqText === '' ? 0 : number(seqText, 'residue number', i + 1),
			insertionCode: pick(row, 'pdbx_PDB_ins_code'),
			x: number(pick(row, 'Cartn_x'), 'Cartn_x', i + 1),
			y: number(pick(row, 'Cartn_y'), 'Cartn_y', i + 1),
			z: number(pick(row, 'Cartn_z'), 'Cartn_z', i + 1),
			hetero: group === null ? null : group === 'HETATM',
			altLoc: pick(row, 'label_alt_id'),
			occupancy: optionalNumber(pick(row, 'occupancy'), 'occupancy', i + 1)
		});
	}
	return chooseAltLocs(atoms);
}

/**
 * Atoms of the first model of a PDB or mmCIF file (the format is recognised from the text).
 * @throws {RangeError} naming the line of a malformed coordinate, or when no atoms are found.
 */
export function parseStructure(text: string): Atom[] {
	if (typeof text !== 'string') throw new TypeError('the structure must be text');
	const isCif = /^data_/m.test(text) && /_atom_site\./.test(text);
	const atoms = isCif ? parseMmcif(text) : parsePdb(text);
	if (atoms.length === 0) throw new RangeError('no ATOM or HETATM records found');
	return atoms;
}

export interface CofactorGroup {
	resName: string;
	/** Family from COFACTOR_RESIDUES, e.g. "heme". */
	family: string;
	chainId: string;
	resSeq: number;
	/** PDB insertion code ('' when none): SF4 A101 and SF4 A101A are two groups. */
	insertionCode: string;
	/** How the group is named to people: residue name, chain, number and insertion code, e.g. "SF4 A101A". */
	label: string;
	atoms: Atom[];
}

/** Groups cofactor atoms (by residue name, COFACTOR_RESIDUES) into one group per residue. */
export function cofactorGroups(atoms: Atom[]): CofactorGroup[] {
	const groups = new Map<string, CofactorGroup>();
	for (const atom of atoms) {
		if (WATER.has(atom.resName)) continue;
		const family = COFACTOR_NAMES.get(atom.resName);
		if (!family) continue;
		const key = `${atom.chainId}|${atom.resSeq}|${atom.insertionCode}|${atom.resName}`;
		let group = groups.get(key);
		if (!group) {
			group = {
				resName: atom.resName,
				family,
				chainId: atom.chainId,
				resSeq: atom.resSeq,
				insertionCode: atom.insertionCode,
				label: `${atom.resName} ${atom.chainId}${atom.resSeq}${atom.insertionCode}`,
				atoms: []
			};
			groups.set(key, group);
		}
		group.atoms.push(atom);
	}
	return [...groups.values()];
}

const heavy = (a: Atom) => a.element !== 'H' && a.element !== 'D';

function distance(a: Atom, b: Atom): number {
	return Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);
}

/**
 * Edge-to-edge distance: the shortest distance between any heavy (non-hydrogen) atoms of the two
 * groups, Å — the R of the Moser–Dutton ruler when the groups are the redox cofactors.
 * @throws {RangeError} when a group has no heavy atoms.
 */
export function edgeToEdgeDistance(a: CofactorGroup, b: CofactorGroup): number {
	const ha = a.atoms.filter(heavy);
	const hb = b.atoms.filter(heavy);
	if (ha.length === 0 || hb.length === 0) throw new RangeError('a group has no heavy atoms');
	let best = Infinity;
	for (const p of ha) for (const q of hb) best = Math.min(best, distance(p, q));
	return best;
}

/** The point a centre-to-centre distance is measured from: metal centroid, else flavin ring, else all heavy atoms. */
export function centreOf(group: CofactorGroup): { x: number; y: number; z: number } {
	const metals = group.atoms.filter((a) => METALS.has(a.element));
	const ring =
		group.family === 'flavin' ? group.atoms.filter((a) => ISOALLOXAZINE.has(a.name)) : [];
	const chosen = metals.length > 0 ? metals : ring.length > 0 ? ring : group.atoms.filter(heavy);
	if (chosen.length === 0) throw new RangeError('a group has no heavy atoms');
	const n = chosen.length;
	return {
		x: chosen.reduce((s, a) => s + a.x, 0) / n,
		y: chosen.reduce((s, a) => s + a.y, 0) / n,
		z: chosen.reduce((s, a) => s + a.z, 0) / n
	};
}

/** Centre-to-centre distance between metal (or ring) centroids, Å. */
export function centreToCentreDistance(a: CofactorGroup, b: CofactorGroup): number {
	const p = centreOf(a);
	const q = centreOf(b);
	return Math.hypot(p.x - q.x, p.y - q.y, p.z - q.z);
}

export interface GroupPair {
	a: CofactorGroup;
	b: CofactorGroup;
	edgeToEdgeA: number;
	centreToCentreA: number;
}

/** Every pair of cofactor groups of a structure with both distances, nearest edges first. */
export function allCofactorDistances(groups: CofactorGroup[]): GroupPair[] {
	const pairs: GroupPair[] = [];
	for (let i = 0; i < groups.length; i++) {
		for (let j = i + 1; j < groups.length; j++) {
			const a = groups[i]!;
			const b = groups[j]!;
			pairs.push({
				a,
				b,
				edgeToEdgeA: edgeToEdgeDistance(a, b),
				centreToCentreA: centreToCentreDistance(a, b)
			});
		}
	}
	return pairs.sort((p, q) => p.edgeToEdgeA - q.edgeToEdgeA);
}
