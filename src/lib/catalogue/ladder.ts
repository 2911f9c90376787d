import { DEFAULT_CHAIN_CONDITIONS, type ChainConditions } from '$lib/schemas/chainConditions';
import type { CentreDto, DistanceDto, PotentialDto } from './dto';

/** What the ladder reads of each record: callers may pass full DTOs or just these fields. */
export type LadderCentre = Pick<CentreDto, 'accession' | 'label'>;
export type LadderPotential = Pick<
	PotentialDto,
	'accession' | 'emMvShe' | 'couple' | 'ph' | 'temperatureK'
> & { centre: { accession: string } };
export type LadderDistance = Pick<DistanceDto, 'centreA' | 'centreB' | 'edgeToEdgeAngstrom'>;

/**
 * The energy ladder of a protein: its centres in electron-transfer chain order, each with one
 * representative Em. Pure; the page draws it.
 *
 * Chain order: centres joined by an edge-to-edge distance of at most 14 Å (the distance within
 * which biological electron tunnelling is fast enough to matter — Page, Moser, Chen & Dutton,
 * Nature 402, 47 (1999)) form a graph; the ladder follows its longest shortest path, found by
 * two breadth-first sweeps (exact for the tree-shaped chains of most complexes). Centres off
 * that path are returned as branches.
 *
 * Representative Em: the potential measured closest to the chosen conditions (pH 7 and 298.15 K
 * unless the reader chose others for the chain estimate; pH weighs 1 unit per 10 K, a value
 * without a stated pH or temperature counts as pH 7 or 298.15 K), the first listed among equals
 * — common practice, no source. No pH or temperature correction is applied.
 */

export const CHAIN_MAX_EDGE_A = 14;

export interface LadderStep {
	centre: string;
	label: string;
	emMv: number | null;
	potential: string | null;
	couple: string | null;
	ph: number | null;
	temperatureK: number | null;
}

export interface LadderHop {
	from: string;
	to: string;
	edgeA: number;
}

export interface Ladder {
	steps: LadderStep[];
	hops: LadderHop[];
	branches: LadderStep[];
	/** The conditions the representative values were chosen nearest to. */
	conditions: ChainConditions;
}

/** How far a value's conditions lie from the chosen ones (the order ladderInputs.ts ranks in). */
export function conditionsDistance(
	p: Pick<LadderPotential, 'ph' | 'temperatureK'>,
	conditions: ChainConditions
): number {
	return (
		Math.abs((p.ph ?? DEFAULT_CHAIN_CONDITIONS.ph) - conditions.ph) +
		Math.abs((p.temperatureK ?? DEFAULT_CHAIN_CONDITIONS.temperatureK) - conditions.temperatureK) /
			10
	);
}

function representative(
	potentials: LadderPotential[],
	conditions: ChainConditions
): LadderPotential | null {
	let best: LadderPotential | null = null;
	let bestScore = Infinity;
	for (const p of potentials) {
		const score = conditionsDistance(p, conditions);
		if (score < bestScore) {
			best = p;
			bestScore = score;
		}
	}
	return best;
}

function farthest(
	start: string,
	adjacency: Map<string, string[]>
): { node: string; parent: Map<string, string> } {
	const parent = new Map<string, string>();
	const seen = new Set([start]);
	let queue = [start];
	let last = start;
	while (queue.length > 0) {
		const next: string[] = [];
		for (const node of queue) {
			last = node;
			for (const n of adjacency.get(node) ?? []) {
				if (seen.has(n)) continue;
				seen.add(n);
				parent.set(n, node);
				next.push(n);
			}
		}
		queue = next;
	}
	return { node: last, parent };
}

export function buildLadder(
	centres: LadderCentre[],
	potentials: LadderPotential[],
	distances: LadderDistance[],
	conditions: ChainConditions = DEFAULT_CHAIN_CONDITIONS
): Ladder {
	const byCentre = new Map<string, LadderPotential[]>();
	for (const p of potentials)
		byCentre.set(p.centre.accession, [...(byCentre.get(p.centre.accession) ?? []), p]);
	const step = (c: LadderCentre): LadderStep => {
		const p = representative(byCentre.get(c.accession) ?? [], conditions);
		return {
			centre: c.accession,
			label: c.label,
			emMv: p?.emMvShe ?? null,
			potential: p?.accession ?? null,
			couple: p?.couple ?? null,
			ph: p?.ph ?? null,
			temperatureK: p?.temperatureK ?? null
		};
	};

	const ids = new Set(centres.map((c) => c.accession));
	const adjacency = new Map<string, string[]>();
	const edges = new Map<string, number>();
	for (const d of distances) {
		const a = d.centreA.accession;
		const b = d.centreB.accession;
		if (!ids.has(a) || !ids.has(b) || d.edgeToEdgeAngstrom > CHAIN_MAX_EDGE_A) continue;
		adjacency.set(a, [...(adjacency.get(a) ?? []), b]);
		adjacency.set(b, [...(adjacency.get(b) ?? []), a]);
		edges.set(`${a}|${b}`, d.edgeToEdgeAngstrom);
		edges.set(`${b}|${a}`, d.edgeToEdgeAngstrom);
	}

	// The longest path over all connected components, by two sweeps from each component.
	let path: string[] = [];
	const covered = new Set<string>();
	for (const c of centres) {
		if (covered.has(c.accession) || !adjacency.has(c.accession)) continue;
		const end = farthest(c.accession, adjacency).node;
		const { node: other, parent } = farthest(end, adjacency);
		const candidate = [other];
		while (candidate.at(-1) !== end)
			candidate.push(parent.get(candidate.at(-1) as string) as string);
		for (const id of parent.keys()) covered.add(id);
		covered.add(end);
		if (candidate.length > path.length) path = candidate;
	}
	const byId = new Map(centres.map((c) => [c.accession, c]));
	let steps = path.map((id) => step(byId.get(id) as LadderCentre));
	// Electrons run on average from low to high Em: start the ladder at the more negative end.
	const first = steps[0]?.emMv;
	const last = steps.at(-1)?.emMv;
	if (first != null && last != null && first > last) {
		path = path.reverse();
		steps = steps.reverse();
	}
	const hops = path.slice(1).map((to, i) => {
		const from = path[i] as string;
		return { from, to, edgeA: edges.get(`${from}|${to}`) as number };
	});
	const onPath = new Set(path);
	return {
		steps,
		hops,
		branches: centres.filter((c) => !onPath.has(c.accession)).map(step),
		conditions: { ph: conditions.ph, temperatureK: conditions.temperatureK }
	};
}
