import type { DistanceDto } from './dto';

/*
 * A protein's edge-to-edge distances as a matrix of its centres: the shortest approved value of
 * each pair (over structures), binned for the colour scale, pairs within 14 Å marked as plausible
 * tunnelling hops (Page, Moser, Chen & Dutton, Nature 402 (1999) 47–52: ≈ 14 Å is the longest
 * physiological single hop). Client-safe: the page only draws what this returns.
 *
 * Drawn from the distances the protein page already reads for its energy ladder
 * (server/catalogue/ladderInputs.ts: the viewer's visible distances, at most 1000), so the
 * matrix costs no query of its own.
 */
export const HOP_LIMIT_A = 14;
/** Upper edges of the colour bins, Å; the last bin is everything beyond. */
export const REACH_BINS_A = [8, 11, 14, 20] as const;

export interface MatrixCell {
	edgeToEdgeA: number;
	accession: string;
	structureId: string;
	/** Within HOP_LIMIT_A. */
	hop: boolean;
	/** 1 (nearest) … 5 (beyond the last bin edge). */
	bin: 1 | 2 | 3 | 4 | 5;
}

/** The fields of a listed distance (catalogue DTO) that the matrix uses. */
export type MatrixDistance = Pick<
	DistanceDto,
	'accession' | 'edgeToEdgeAngstrom' | 'structureId'
> & { centreA: { accession: string }; centreB: { accession: string } };

export interface DistanceMatrix {
	centres: { accession: string; label: string }[];
	/** cells[i][j]; null on the diagonal and where no distance is recorded. */
	cells: (MatrixCell | null)[][];
}

export function reachBin(edgeA: number): MatrixCell['bin'] {
	const i = REACH_BINS_A.findIndex((edge) => edgeA <= edge);
	return (i < 0 ? 5 : i + 1) as MatrixCell['bin'];
}

/**
 * The matrix of the centres that have at least one distance, in the order given; a centre
 * without distances is left out so that the matrix stays small.
 */
export function distanceMatrix(
	centres: { accession: string; label: string }[],
	distances: readonly MatrixDistance[]
): DistanceMatrix {
	const withDistance = new Set(
		distances.flatMap((d) => [d.centreA.accession, d.centreB.accession])
	);
	const shown = centres.filter((c) => withDistance.has(c.accession));
	const index = new Map(shown.map((c, i) => [c.accession, i]));
	const cells: (MatrixCell | null)[][] = shown.map(() => shown.map(() => null));
	for (const d of distances) {
		const i = index.get(d.centreA.accession);
		const j = index.get(d.centreB.accession);
		if (i === undefined || j === undefined || i === j) continue;
		const edgeA = d.edgeToEdgeAngstrom;
		const current = cells[i]![j];
		if (current && current.edgeToEdgeA <= edgeA) continue;
		const cell: MatrixCell = {
			edgeToEdgeA: edgeA,
			accession: d.accession,
			structureId: d.structureId,
			hop: edgeA <= HOP_LIMIT_A,
			bin: reachBin(edgeA)
		};
		cells[i]![j] = cell;
		cells[j]![i] = cell;
	}
	return { centres: shown, cells };
}
