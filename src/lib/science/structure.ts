/*
 * Reading atoms from PDB and PDBx/mmCIF coordinate files, grouping cofactor atoms into redox
 * centres, and measuring edge-to-edge and centre-to-centre distances between them (Å).
 *
 * References: wwPDB, *Atomic Coordinate Entry Format Description*, v3.3 (ATOM/HETATM columns);
 * wwPDB PDBx/mmCIF dictionary, category atom_site; residue names from the wwPDB Chemical
 * Component Dictionary (listed in COFACTOR_RESIDUES). Only the first model is read; for atoms
 * with alternate locations the first location met is kept; waters are never cofactors.
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
	hetero: boolean;
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

function guessElement(atomName: string): string {
	const letters = atomName.replace(/[^A-Za-z]/g, '').toUpperCase();
	for (const two of ['FE', 'CU', 'NI', 'MO', 'ZN', 'MG', 'MN', 'CO', 'CL', 'SE']) {
		if (letters.startsWith(two) && atomName.trim().toUpperCase().startsWith(two)) return two;
	}
	return letters.slice(0, 1);
}

function number(text: string, what: string, line: number): number {
	const value = Number(text.trim());
	if (text.trim() === '' || !Number.isFinite(value)) {
		throw new RangeError(`line ${line}: ${what} "${text.trim()}" is not a number`);
	}
	return value;
}

function keepFirstAltLoc(): (key: string, altLoc: string) => boolean {
	const seen = new Map<string, string>();
	return (key, altLoc) => {
		if (altLoc === '' || altLoc === '.' || altLoc === '?') return true;
		const first = seen.get(key);
		if (first === undefined) {
			seen.set(key, altLoc);
			return true;
		}
		return first === altLoc;
	};
}

function parsePdb(text: string): Atom[] {
	const atoms: Atom[] = [];
	const keep = keepFirstAltLoc();
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
		const name = line.slice(12, 16).trim();
		const resName = line.slice(17, 20).trim();
		const chainId = line.slice(21, 22).trim();
		const resSeq = number(line.slice(22, 26), 'residue number', i + 1);
		const insertionCode = line.slice(26, 27).trim();
		if (
			!keep(`${chainId}|${resSeq}|${insertionCode}|${resName}|${name}`, line.slice(16, 17).trim())
		)
			continue;
		const element = line.slice(76, 78).trim().toUpperCase() || guessElement(name);
		atoms.push({
			name,
			element,
			resName,
			chainId,
			resSeq,
			insertionCode,
			x: number(line.slice(30, 38), 'x', i + 1),
			y: number(line.slice(38, 46), 'y', i + 1),
			z: number(line.slice(46, 54), 'z', i + 1),
			hetero: record === 'HETATM'
		});
	}
	return atoms;
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
	const required = ['group_PDB', 'Cartn_x', 'Cartn_y', 'Cartn_z'];
	for (const r of required)
		if (col(r) < 0) throw new RangeError(`the atom_site loop lacks _atom_site.${r}`);
	const pick = (row: string[], ...names: string[]) => {
		for (const n of names) {
			const c = col(n);
			if (c >= 0 && row[c] !== undefined && row[c] !== '?' && row[c] !== '.') return row[c]!;
		}
		return '';
	};
	const atoms: Atom[] = [];
	const keep = keepFirstAltLoc();
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
		const group = pick(row, 'group_PDB');
		if (group !== 'ATOM' && group !== 'HETATM') continue;
		const name = pick(row, 'auth_atom_id', 'label_atom_id');
		const resName = pick(row, 'auth_comp_id', 'label_comp_id');
		const chainId = pick(row, 'auth_asym_id', 'label_asym_id');
		const seqText = pick(row, 'auth_seq_id', 'label_seq_id');
		const resSeq = seqText === '' ? 0 : number(seqText, 'residue number', i + 1);
		const insertionCode = pick(row, 'pdbx_PDB_ins_code');
		if (
			!keep(`${chainId}|${resSeq}|${insertionCode}|${resName}|${name}`, pick(row, 'label_alt_id'))
		)
			continue;
		atoms.push({
			name,
			element: (pick(row, 'type_symbol') || guessElement(name)).toUpperCase(),
			resName,
			chainId,
			resSeq,
			insertionCode,
			x: number(pick(row, 'Cartn_x'), 'Cartn_x', i + 1),
			y: number(pick(row, 'Cartn_y'), 'Cartn_y', i + 1),
			z: number(pick(row, 'Cartn_z'), 'Cartn_z', i + 1),
			hetero: group === 'HETATM'
		});
	}
	return atoms;
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
