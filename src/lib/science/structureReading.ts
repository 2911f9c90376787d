import { cofactorGroups, parseStructure, type CofactorGroup } from './structure';
import {
	ligandResidues,
	proposeMatches,
	type CentreToMatch,
	type GroupMatch
} from './structureMatch';

/*
 * A structure file's text to its cofactor groups and a proposed match to a protein's centres,
 * with the bounds that keep the later distance search cheap. A file it cannot use is a
 * RangeError whose message says why (the server answers it as a 400 on the file field). The
 * server runs it in its calculation worker pool: a large file is seconds of parsing.
 */

/** At most this many cofactor groups are read from one file. */
export const MAX_GROUPS = 500;
/**
 * At most this many atoms in one cofactor group. The largest cofactors have about a hundred
 * atoms with their hydrogens (FAD: 53 heavy atoms; common practice, no source); the
 * edge-to-edge search compares every atom of one group with every atom of another, so a group
 * of thousands (a polymer under a cofactor's residue name) would cost the server seconds.
 */
export const MAX_GROUP_ATOMS = 300;

/** A centre as the match needs it, named by its accession. */
export type StructureCentre = Omit<CentreToMatch, 'id'> & { accession: string };

export interface GroupRow {
	index: number;
	label: string;
	resName: string;
	chainId: string;
	resSeq: number;
	insertionCode: string;
	atomCount: number;
	/** Ligand residues, e.g. "S17". */
	ligands: string[];
}

export interface StructureReading {
	groups: CofactorGroup[];
	rows: GroupRow[];
	proposals: GroupMatch[];
}

/** Parses the text and proposes a match; a file it cannot use is a RangeError saying why. */
export function readStructureText(text: string, centres: StructureCentre[]): StructureReading {
	let groups: CofactorGroup[];
	let atoms;
	try {
		atoms = parseStructure(text);
		groups = cofactorGroups(atoms);
	} catch (e) {
		if (e instanceof RangeError || e instanceof TypeError)
			throw new RangeError(`the structure file could not be read: ${e.message}`);
		throw e;
	}
	if (groups.length === 0)
		throw new RangeError(
			'no cofactor groups (iron–sulfur clusters, hemes, flavins, quinones, metals) in this file'
		);
	const oversized = groups.find((g) => g.atoms.length > MAX_GROUP_ATOMS);
	if (oversized)
		throw new RangeError(
			`the group ${oversized.label} has ${oversized.atoms.length} atoms; a cofactor group may have at most ${MAX_GROUP_ATOMS} (is a polymer written under a cofactor's residue name?)`
		);
	if (groups.length > MAX_GROUPS)
		throw new RangeError(
			`the file has ${groups.length} cofactor groups; at most ${MAX_GROUPS} are read at once`
		);
	const ligands = groups.map((g) => ligandResidues(g, atoms));
	const proposals = proposeMatches(
		groups,
		ligands,
		centres.map((c) => ({ ...c, id: c.accession }))
	);
	const rows = groups.map((g, index) => ({
		index,
		label: g.label,
		resName: g.resName,
		chainId: g.chainId,
		resSeq: g.resSeq,
		insertionCode: g.insertionCode,
		atomCount: g.atoms.length,
		ligands: ligands[index]!.map((l) => `${l.chainId}${l.resSeq}`)
	}));
	return { groups, rows, proposals };
}
