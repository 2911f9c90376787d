/*
 * From a structure's cofactor groups to proposed distances between a protein's centres: which
 * group is which centre (by cofactor kind and chain/residue numbers), the two closest heavy atoms
 * of a pair (named, so that a curator can check them), and the pairs within a cutoff.
 *
 * References: wwPDB Chemical Component Dictionary for the residue names (see COFACTOR_RESIDUES in
 * structure.ts); C. C. Page, C. C. Moser, X. Chen & P. L. Dutton, Nature 402 (1999) 47–52, for
 * edge-to-edge distance between heavy atoms as the tunnelling distance and ≈ 14 Å as the longest
 * physiological single hop; 25 Å as the default cutoff is common practice, no source (beyond it a
 * direct hop is far too slow to matter).
 */
import type { CofactorKind } from '$lib/schemas/vocabulary';
import { centreToCentreDistance, type Atom, type CofactorGroup } from './structure';

/** The cofactor kinds a Chemical Component Dictionary residue name may stand for. */
const KINDS_BY_RESIDUE: Record<string, readonly CofactorKind[]> = {
	SF4: ['fe4s4', 'fe4s4_hipip'],
	F3S: ['fe3s4'],
	FES: ['fe2s2_ferredoxin', 'fe2s2_rieske'],
	HEA: ['heme_a'],
	HAS: ['heme_a'],
	HEM: ['heme_b'],
	HEB: ['heme_b'],
	DHE: ['other'],
	HEC: ['heme_c'],
	SRM: ['other'],
	FMN: ['fmn'],
	FAD: ['fad'],
	FDA: ['fad'],
	UQ1: ['ubiquinone'],
	UQ2: ['ubiquinone'],
	U10: ['ubiquinone'],
	MQ7: ['menaquinone'],
	MQ8: ['menaquinone'],
	MQ9: ['menaquinone'],
	PL9: ['plastoquinone'],
	PQN: ['other'],
	CU: ['cu_type1'],
	CU1: ['cu_type1'],
	CUA: ['cu_a'],
	MGD: ['mo_w_pterin'],
	MTE: ['mo_w_pterin'],
	MO: ['mo_w_pterin'],
	W: ['mo_w_pterin'],
	NI: ['nife'],
	FCO: ['nife']
};

/** The cofactor kinds a residue name may stand for ("other" when the name is not listed). */
export function kindsForResidue(resName: string): readonly CofactorKind[] {
	return KINDS_BY_RESIDUE[resName.toUpperCase()] ?? ['other'];
}

const isHeavy = (a: Atom) => a.element !== 'H' && a.element !== 'D';

export interface NamedAtom {
	/** Atom name as in the file, e.g. FE1, CMB. */
	name: string;
	element: string;
	/** The group's label, e.g. "SF4 A101". */
	group: string;
}

export interface ClosestAtoms {
	/** Edge-to-edge distance, Å: the shortest distance between heavy atoms of the two groups. */
	distanceA: number;
	atomA: NamedAtom;
	atomB: NamedAtom;
}

/**
 * The two closest heavy (non-hydrogen) atoms of two groups and their distance in Å — the
 * edge-to-edge distance with the atoms that define it. Ties keep the first pair in file order.
 * @throws {RangeError} when a group has no heavy atoms.
 * @example closestHeavyAtoms(sf4, hem) // { distanceA: 5, atomA: { name: 'S2', … }, atomB: … }
 */
export function closestHeavyAtoms(a: CofactorGroup, b: CofactorGroup): ClosestAtoms {
	const ha = a.atoms.filter(isHeavy);
	const hb = b.atoms.filter(isHeavy);
	if (ha.length === 0 || hb.length === 0)
		throw new RangeError(`${ha.length === 0 ? a.label : b.label} has no heavy atoms`);
	let best = Infinity;
	let pa = ha[0]!;
	let pb = hb[0]!;
	for (const p of ha) {
		for (const q of hb) {
			// Squared distances while searching: the root once at the end.
			const d2 = (p.x - q.x) ** 2 + (p.y - q.y) ** 2 + (p.z - q.z) ** 2;
			if (d2 < best) [best, pa, pb] = [d2, p, q];
		}
	}
	return {
		distanceA: Math.sqrt(best),
		atomA: { name: pa.name, element: pa.element, group: a.label },
		atomB: { name: pb.name, element: pb.element, group: b.label }
	};
}

export interface StructurePair {
	/** Indexes into the groups given. */
	a: number;
	b: number;
	edge: ClosestAtoms;
	/** Centre-to-centre distance (metal or ring centroids, structure.ts `centreOf`), Å. */
	centreToCentreA: number;
}

/** Options of `pairsWithinCutoff`. */
export interface CutoffOptions {
	/** Largest edge-to-edge distance kept, Å. @default 25 */
	cutoffA?: number;
}

export const DEFAULT_CUTOFF_A = 25;
/** Longest edge-to-edge distance of a plausible single tunnelling hop, Å (Page et al. 1999). */
export const PLAUSIBLE_HOP_A = 14;

/**
 * Every pair of groups whose edge-to-edge distance is at most the cutoff, nearest first, with
 * the two atoms that define it and the centre-to-centre distance.
 * @throws {RangeError} for a cutoff that is not a positive finite number.
 */
export function pairsWithinCutoff(
	groups: CofactorGroup[],
	options: CutoffOptions = {}
): StructurePair[] {
	const cutoffA = options.cutoffA ?? DEFAULT_CUTOFF_A;
	if (!Number.isFinite(cutoffA) || cutoffA <= 0)
		throw new RangeError(`the cutoff must be a positive number of Å, not ${cutoffA}`);
	const pairs: StructurePair[] = [];
	for (let i = 0; i < groups.length; i++) {
		for (let j = i + 1; j < groups.length; j++) {
			const edge = closestHeavyAtoms(groups[i]!, groups[j]!);
			if (edge.distanceA > cutoffA) continue;
			pairs.push({
				a: i,
				b: j,
				edge,
				centreToCentreA: centreToCentreDistance(groups[i]!, groups[j]!)
			});
		}
	}
	return pairs.sort((p, q) => p.edge.distanceA - q.edge.distanceA);
}

/** Largest distance from a group's heavy atom to a protein atom counted as its ligand, Å. */
const LIGAND_REACH_A = 3.0;

/**
 * Residues of other atoms (amino acids and the like, not cofactors or water) within 3.0 Å of a
 * group's heavy atoms: the ligands, e.g. the cysteines of a cluster (Fe–S(Cys) ≈ 2.3 Å) or the
 * histidines of a heme (Fe–N ≈ 2.0 Å). 3.0 Å is common practice, no source.
 */
export function ligandResidues(
	group: CofactorGroup,
	atoms: Atom[]
): { chainId: string; resSeq: number }[] {
	const own = group.atoms.filter(isHeavy);
	const found = new Map<string, { chainId: string; resSeq: number }>();
	if (own.length === 0) return [];
	const reach2 = LIGAND_REACH_A ** 2;
	// The group's box grown by the reach: most atoms of a large file are rejected by six
	// comparisons instead of one distance per atom of the group.
	const lo = (k: 'x' | 'y' | 'z') => Math.min(...own.map((a) => a[k])) - LIGAND_REACH_A;
	const hi = (k: 'x' | 'y' | 'z') => Math.max(...own.map((a) => a[k])) + LIGAND_REACH_A;
	const [x0, x1, y0, y1, z0, z1] = [lo('x'), hi('x'), lo('y'), hi('y'), lo('z'), hi('z')];
	for (const atom of atoms) {
		if (atom.x < x0 || atom.x > x1 || atom.y < y0 || atom.y > y1 || atom.z < z0 || atom.z > z1)
			continue;
		if (!isHeavy(atom) || atom.resName === group.resName || atom.resName === 'HOH') continue;
		const key = `${atom.chainId}|${atom.resSeq}`;
		if (found.has(key)) continue;
		for (const p of own) {
			if ((p.x - atom.x) ** 2 + (p.y - atom.y) ** 2 + (p.z - atom.z) ** 2 <= reach2) {
				found.set(key, { chainId: atom.chainId, resSeq: atom.resSeq });
				break;
			}
		}
	}
	return [...found.values()];
}

/** What a centre records for matching (centre schema: cofactor kind, chain, residue numbers). */
export interface CentreToMatch {
	id: string;
	cofactorKind: CofactorKind;
	chainId: string | null;
	residues: readonly number[];
}

export type MatchBasis = 'residue' | 'ligands' | 'kind';

export interface GroupMatch {
	/** Index into the groups given. */
	group: number;
	/** The proposed centre's id, or null when none is proposed. */
	centreId: string | null;
	/**
	 * Why: "residue" — same kind, chain and the group's own residue number on the centre;
	 * "ligands" — same kind and chain, residues of the centre among the group's ligands;
	 * "kind" — the only group and the only centre of that kind left (to be checked).
	 */
	basis: MatchBasis | null;
}

/**
 * Proposes which group is which centre. Strongest evidence first (own residue number, then the
 * most shared ligand residues, then a kind left with one group and one centre); each centre and
 * each group is used once. A centre without a chain matches on residue numbers alone.
 * `ligands[i]` are the ligand residues of group i (`ligandResidues`).
 */
export function proposeMatches(
	groups: CofactorGroup[],
	ligands: { chainId: string; resSeq: number }[][],
	centres: CentreToMatch[]
): GroupMatch[] {
	const candidates: { g: number; c: number; score: number; basis: MatchBasis }[] = [];
	groups.forEach((group, g) => {
		const kinds = kindsForResidue(group.resName);
		centres.forEach((centre, c) => {
			if (!kinds.includes(centre.cofactorKind)) return;
			const chainOk = (chainId: string) => centre.chainId === null || centre.chainId === chainId;
			if (chainOk(group.chainId) && centre.residues.includes(group.resSeq)) {
				candidates.push({ g, c, score: 1000, basis: 'residue' });
				return;
			}
			const shared = (ligands[g] ?? []).filter(
				(l) => chainOk(l.chainId) && centre.residues.includes(l.resSeq)
			).length;
			if (shared > 0) candidates.push({ g, c, score: shared, basis: 'ligands' });
		});
	});
	candidates.sort((p, q) => q.score - p.score || p.g - q.g || p.c - q.c);
	const byGroup = new Map<number, { c: number; basis: MatchBasis }>();
	const usedCentres = new Set<number>();
	for (const { g, c, basis } of candidates) {
		if (byGroup.has(g) || usedCentres.has(c)) continue;
		byGroup.set(g, { c, basis });
		usedCentres.add(c);
	}
	// A kind left with exactly one group and one centre: proposed, marked as kind only.
	const leftGroups = groups.map((_, g) => g).filter((g) => !byGroup.has(g));
	for (const g of leftGroups) {
		const kinds = kindsForResidue(groups[g]!.resName);
		if (kinds.includes('other')) continue;
		const sameKindGroups = leftGroups.filter((h) =>
			kindsForResidue(groups[h]!.resName).some((k) => kinds.includes(k))
		);
		const freeCentres = centres
			.map((_, c) => c)
			.filter((c) => !usedCentres.has(c) && kinds.includes(centres[c]!.cofactorKind));
		if (sameKindGroups.length === 1 && freeCentres.length === 1) {
			byGroup.set(g, { c: freeCentres[0]!, basis: 'kind' });
			usedCentres.add(freeCentres[0]!);
		}
	}
	return groups.map((_, g) => {
		const m = byGroup.get(g);
		return { group: g, centreId: m ? centres[m.c]!.id : null, basis: m?.basis ?? null };
	});
}
