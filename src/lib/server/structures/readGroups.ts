import {
	cofactorGroups,
	ligandResidues,
	parseStructure,
	proposeMatches,
	type CofactorGroup,
	type GroupMatch
} from '$lib/science';
import { StructureFileError } from './readStructureFile';
import type { ProteinForStructure } from './structureDistances';

/*
 * A structure file's text to its cofactor groups and a proposed match to the protein's centres.
 * Pure and free of the database, because it runs in the calculation worker pool (jobs.ts): a
 * large file is seconds of parsing, which must not hold up the thread that answers requests.
 */

/** At most this many cofactor groups are read from one file. */
export const MAX_GROUPS = 500;

export type StructureCentre = ProteinForStructure['centres'][number];

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

/** Parses the text and proposes a match; a malformed file is a 400 with the parser's reason. */
export function readGroups(text: string, centres: StructureCentre[]): StructureReading {
	let groups: CofactorGroup[];
	let atoms;
	try {
		atoms = parseStructure(text);
		groups = cofactorGroups(atoms);
	} catch (e) {
		if (e instanceof RangeError || e instanceof TypeError)
			throw new StructureFileError(`the structure file could not be read: ${e.message}`);
		throw e;
	}
	if (groups.length === 0)
		throw new StructureFileError(
			'no cofactor groups (iron–sulfur clusters, hemes, flavins, quinones, metals) in this file'
		);
	if (groups.length > MAX_GROUPS)
		throw new StructureFileError(
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
