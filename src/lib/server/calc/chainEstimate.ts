import type {
	ChainEstimate,
	ChainForm,
	ChainRole,
	UsedPotential
} from '$lib/catalogue/chainEstimate';
import type { ListedPotential } from '$lib/catalogue/conflicts';
import type { CentreDto } from '$lib/catalogue/dto';
import {
	CHAIN_MAX_EDGE_A,
	conditionsDistance,
	type Ladder,
	type LadderDistance
} from '$lib/catalogue/ladder';
import { analyseChain, monteCarloChain, type ChainInput } from '$lib/science';
import type { ChainChoice } from '$lib/schemas/chainChoice';
import type { ChainConditions } from '$lib/schemas/chainConditions';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { COUPLES_BY_KIND, type CofactorKind } from '$lib/schemas/vocabulary';

/*
 * The chain estimate of a protein page: which centres and potentials it uses (planChain, on the
 * request thread: cheap) and the estimate itself (estimateChain, in a calculation worker).
 *
 * The chain: every centre the electron can reach from the entry without passing the exit, through
 * hops between centres within 14 Å edge to edge (the ladder's rule), each with a potential the
 * reader can see; side branches included, since an electron visits them too. One hop per pair of
 * centres (where a pair has several distances, the one listed last, as on the ladder).
 *
 * The potentials: one electron crosses at a time, so every centre enters with a one-electron
 * couple. The entry gives up an electron from its reduced level (a flavin's sq/hq couple, a
 * quinol's SQ/QH2); every other centre takes one into its oxidised level (ox/sq, Q/SQ). Where that
 * couple is not recorded, the two-electron couple (ox/hq, Q/QH2: the mean of the two one-electron
 * potentials) stands in and the hop is marked "two-electron couple used as an approximation";
 * failing that, the other one-electron couple, marked likewise. Other centres use the first couple
 * of their kind's list that has a value (the physiological one: [4Fe-4S]2+/1+ before 1+/0). Of
 * each couple, the value measured nearest the chosen pH and temperature; no pH correction is
 * applied (the registry records no pKa) and no temperature correction either.
 */

/** Default reorganization energy for the chain estimate on protein pages, eV (common practice, no source). */
export const CHAIN_LAMBDA_EV = 0.7;

/** Monte Carlo samples over the reported uncertainties (seeded, so the estimate is repeatable). */
const CHAIN_SAMPLES = 2000;

/** Two-electron couples and the one-electron couples they are made of. */
const ONE_ELECTRON_HALVES: Record<string, { oxidised: string; reduced: string }> = {
	'ox/hq': { oxidised: 'ox/sq', reduced: 'sq/hq' },
	'Q/QH2': { oxidised: 'Q/SQ', reduced: 'SQ/QH2' }
};
const TWO_ELECTRON_COUPLES = new Set(['ox/hq', 'Q/QH2', '[3Fe-4S]0/2-']);
export const TWO_ELECTRON_NOTE = 'two-electron couple used as an approximation';

/**
 * Cofactors where substrates give or take electrons (flavins, quinones, the catalytic metal
 * sites): a chain runs between them when a protein has two, rather than between the ladder's ends.
 */
const SUBSTRATE_SITES: ReadonlySet<CofactorKind> = new Set([
	'fmn',
	'fad',
	'ubiquinone',
	'menaquinone',
	'plastoquinone',
	'nife',
	'fefe',
	'mo_w_pterin'
]);

/** What the chain estimate of a protein page is computed from (plain data: it goes to a worker). */
export interface LadderChainInput {
	chain: ChainInput;
	labels: Record<string, string>;
	used: Record<string, UsedPotential>;
	conditions: ChainConditions;
	leftOut: string[];
}

export interface ChainData {
	centres: Pick<CentreDto, 'accession' | 'label' | 'cofactorKind'>[];
	/** Per centre and couple, the value nearest the chosen conditions (ladderInputs.ts). */
	potentials: ListedPotential[];
	distances: LadderDistance[];
}

export type ChainPlan =
	| {
			ok: true;
			/** Null: nothing to estimate (see note). */
			input: LadderChainInput | null;
			note: string | null;
			/** Null when fewer than two centres could end a chain. */
			form: ChainForm | null;
	  }
	| { ok: false; fields: FieldErrors };

/** The potential a centre enters the chain with, for its role, and why when it is a stand-in. */
export function choosePotential(
	kind: CofactorKind,
	candidates: ReadonlyMap<string, ListedPotential>,
	role: ChainRole,
	conditions: ChainConditions
): { potential: ListedPotential; approximation: UsedPotential['approximation'] } | null {
	const vocabulary = COUPLES_BY_KIND[kind];
	const family = Object.entries(ONE_ELECTRON_HALVES).find(([two]) => vocabulary.includes(two));
	if (family) {
		const [two, halves] = family;
		const wanted = role === 'entry' ? halves.reduced : halves.oxidised;
		const other = role === 'entry' ? halves.oxidised : halves.reduced;
		const exact = candidates.get(wanted);
		if (exact) return { potential: exact, approximation: null };
		const whole = candidates.get(two);
		if (whole)
			return {
				potential: whole,
				approximation: {
					mark: TWO_ELECTRON_NOTE,
					detail: `${TWO_ELECTRON_NOTE} (${two}; the one-electron ${wanted} couple is not recorded)`
				}
			};
		const half = candidates.get(other);
		if (half)
			return {
				potential: half,
				approximation: {
					mark: `${other} used in place of ${wanted}`,
					detail: `${other} used in place of ${wanted}, which is not recorded`
				}
			};
	}
	const listed = vocabulary.map((c) => candidates.get(c)).find((p) => p !== undefined);
	const chosen =
		listed ??
		[...candidates.values()].reduce<ListedPotential | null>(
			(best, p) =>
				best === null || conditionsDistance(p, conditions) < conditionsDistance(best, conditions)
					? p
					: best,
			null
		);
	if (!chosen) return null;
	return {
		potential: chosen,
		approximation: TWO_ELECTRON_COUPLES.has(chosen.couple)
			? {
					mark: TWO_ELECTRON_NOTE,
					detail: `${TWO_ELECTRON_NOTE} (${chosen.couple}; no one-electron couple is recorded)`
				}
			: null
	};
}

/** Breadth-first hop counts from `start` over `adjacency`, never passing `barrier`. */
function hopCounts(
	start: string,
	adjacency: ReadonlyMap<string, string[]>,
	barrier: string | null = null
): Map<string, number> {
	const seen = new Map([[start, 0]]);
	const queue = [start];
	for (let head = 0; head < queue.length; head++) {
		const node = queue[head]!;
		if (node === barrier) continue;
		for (const next of adjacency.get(node) ?? []) {
			if (seen.has(next)) continue;
			seen.set(next, seen.get(node)! + 1);
			queue.push(next);
		}
	}
	return seen;
}

/**
 * The ends a chain runs between by default: where the ladder's component holds two or more
 * substrate sites (flavins, quinones, catalytic metal sites), the most reducing and the most
 * oxidising of them; with one, that site and the ladder end farthest from it; otherwise the
 * ladder's two ends. The lower potential is the entry (electrons run on average downhill).
 */
function defaultEnds(
	ladder: Ladder,
	eligible: readonly string[],
	kinds: ReadonlyMap<string, CofactorKind>,
	em: ReadonlyMap<string, number>,
	adjacency: ReadonlyMap<string, string[]>
): [string, string] | null {
	const onPath = ladder.steps.map((s) => s.centre).filter((c) => eligible.includes(c));
	const start = onPath[0] ?? eligible[0];
	if (start === undefined) return null;
	const component = hopCounts(start, adjacency);
	const sites = eligible.filter((c) => component.has(c) && SUBSTRATE_SITES.has(kinds.get(c)!));
	const byEm = (a: string, b: string) => em.get(a)! - em.get(b)!;
	let ends: string[];
	if (sites.length >= 2) {
		const sorted = [...sites].sort(byEm);
		ends = [sorted[0]!, sorted.at(-1)!];
	} else if (sites.length === 1) {
		const site = sites[0]!;
		const from = hopCounts(site, adjacency);
		const others = [onPath[0], onPath.at(-1)].filter(
			(c): c is string => c !== undefined && c !== site
		);
		const far = others.sort((a, b) => from.get(b)! - from.get(a)!)[0];
		ends = far === undefined ? [] : [site, far];
	} else {
		ends = [onPath[0], onPath.at(-1)].filter((c): c is string => c !== undefined);
	}
	if (ends.length !== 2 || ends[0] === ends[1]) {
		const reached = eligible.filter((c) => component.has(c) && c !== start);
		if (reached.length === 0) return null;
		ends = [start, reached.at(-1)!];
	}
	return ends.sort(byEm) as [string, string];
}

/**
 * The chain a protein page estimates, for the reader's choice: its centres, hops and potentials,
 * the choice form, and why there is no estimate where there is none. A centre named in the query
 * that is not one of the protein's centres the reader may see answers exactly as an unknown one.
 */
export function planChain(ladder: Ladder, data: ChainData, choice: ChainChoice): ChainPlan {
	const { conditions } = choice;
	const labels = new Map(data.centres.map((c) => [c.accession, c.label]));
	const kinds = new Map(data.centres.map((c) => [c.accession, c.cofactorKind]));
	const candidates = new Map<string, Map<string, ListedPotential>>();
	for (const p of data.potentials) {
		const mine = candidates.get(p.centre.accession) ?? new Map<string, ListedPotential>();
		const held = mine.get(p.couple);
		if (!held || conditionsDistance(p, conditions) < conditionsDistance(held, conditions))
			mine.set(p.couple, p);
		candidates.set(p.centre.accession, mine);
	}
	const hasPotential = (c: string) => (candidates.get(c)?.size ?? 0) > 0;

	// One hop per pair of centres within 14 Å: the distance listed last, as the ladder keeps it.
	const pairs = new Map<string, { from: string; to: string; edgeA: number }>();
	for (const d of data.distances) {
		const [a, b] = [d.centreA.accession, d.centreB.accession];
		if (a === b || !labels.has(a) || !labels.has(b) || d.edgeToEdgeAngstrom > CHAIN_MAX_EDGE_A)
			continue;
		pairs.set(a < b ? `${a}|${b}` : `${b}|${a}`, { from: a, to: b, edgeA: d.edgeToEdgeAngstrom });
	}
	const adjacency = new Map<string, string[]>();
	const allAdjacency = new Map<string, string[]>();
	for (const { from, to } of pairs.values()) {
		for (const [x, y] of [
			[from, to],
			[to, from]
		] as const) {
			allAdjacency.set(x, [...(allAdjacency.get(x) ?? []), y]);
			if (hasPotential(x) && hasPotential(y)) adjacency.set(x, [...(adjacency.get(x) ?? []), y]);
		}
	}

	// Centres that may end a chain, in ladder order, then the branches.
	const order = [...ladder.steps, ...ladder.branches].map((s) => s.centre);
	const eligible = order.filter((c) => hasPotential(c) && (adjacency.get(c)?.length ?? 0) > 0);
	const representativeEm = new Map(
		[...ladder.steps, ...ladder.branches].flatMap((s) =>
			s.emMv === null ? [] : [[s.centre, s.emMv] as const]
		)
	);
	const ends = defaultEnds(ladder, eligible, kinds, representativeEm, adjacency);

	const fields: FieldErrors = {};
	for (const key of ['entry', 'exit'] as const) {
		const named = choice[key];
		if (named === null) continue;
		if (!labels.has(named))
			fields[key] = [
				`no centre ${named} among the centres of this protein (or not visible to you)`
			];
		else if (!hasPotential(named))
			fields[key] = [
				`centre ${labels.get(named)} (${named}) has no potential you can see, so the chain cannot ${key === 'entry' ? 'start' : 'end'} there`
			];
	}
	if (Object.keys(fields).length > 0) return { ok: false, fields };
	if (!ends && choice.entry === null && choice.exit === null)
		return { ok: true, input: null, note: null, form: null };
	// A default end the reader already chose for the other end gives way to the other default.
	const other = (named: string | null, preferred: string | undefined, spare: string | undefined) =>
		(preferred === named ? spare : preferred) ?? null;
	const entry = choice.entry ?? other(choice.exit, ends?.[0], ends?.[1]);
	const exit = choice.exit ?? other(entry, ends?.[1], ends?.[0]);
	if (entry === null || exit === null)
		return {
			ok: false,
			fields: {
				[entry === null ? 'entry' : 'exit']: [
					'no other centre of this protein has a potential and a neighbour within 14 Å'
				]
			}
		};
	if (entry === exit)
		return { ok: false, fields: { exit: ['entry and exit must be different centres'] } };

	const form: ChainForm = {
		options: eligible.map((c) => ({ accession: c, label: labels.get(c)! })),
		entry,
		exit,
		conditions,
		chosen: choice.chosen
	};
	// Choices made by URL may name a centre the form does not list (no neighbour): still shown.
	for (const c of [entry, exit])
		if (!form.options.some((o) => o.accession === c))
			form.options.push({ accession: c, label: labels.get(c)! });

	const reached = hopCounts(entry, adjacency, exit);
	const leftOut = [
		...new Set(
			[...reached.keys()]
				.filter((c) => c !== exit)
				.flatMap((c) => allAdjacency.get(c) ?? [])
				.filter((c) => !hasPotential(c))
		)
	].map((c) => labels.get(c)!);
	const name = (c: string) => labels.get(c)!;
	if (!reached.has(exit)) {
		const missing = leftOut.length > 0 ? ` (${leftOut.join(', ')}: no potential you can see)` : '';
		return {
			ok: true,
			input: null,
			note: `No chain of hops joins ${name(entry)} and ${name(exit)}: no path of centres with potentials, each within ${CHAIN_MAX_EDGE_A} Å edge to edge of the next, links them${missing}.`,
			form
		};
	}

	const members = [...reached.keys()];
	const used: Record<string, UsedPotential> = {};
	for (const c of members) {
		const role: ChainRole = c === entry ? 'entry' : c === exit ? 'exit' : 'relay';
		const pick = choosePotential(kinds.get(c)!, candidates.get(c)!, role, conditions)!;
		used[c] = {
			centre: c,
			label: name(c),
			role,
			potential: pick.potential.accession,
			couple: pick.potential.couple,
			emMv: pick.potential.emMvShe,
			uncertaintyMv: pick.potential.uncertaintyMv,
			ph: pick.potential.ph,
			temperatureK: pick.potential.temperatureK,
			approximation: pick.approximation
		};
	}
	const inChain = new Set(members);
	// In the direction of travel: from the end nearer the entry, nearest hops first.
	const depth = (c: string) => reached.get(c)!;
	const hops = [...pairs.values()]
		.filter((p) => inChain.has(p.from) && inChain.has(p.to))
		.map((p) =>
			depth(p.from) <= depth(p.to)
				? { from: p.from, to: p.to, edgeDistanceA: p.edgeA }
				: { from: p.to, to: p.from, edgeDistanceA: p.edgeA }
		)
		.sort((a, b) => depth(a.from) + depth(a.to) - depth(b.from) - depth(b.to));
	return {
		ok: true,
		input: {
			chain: {
				centres: members.map((c) => ({
					id: c,
					emMv: used[c]!.emMv,
					emSigmaMv: used[c]!.uncertaintyMv ?? undefined
				})),
				hops,
				entry,
				exit,
				lambdaEv: CHAIN_LAMBDA_EV,
				temperatureK: conditions.temperatureK,
				model: 'moser-dutton'
			},
			labels: Object.fromEntries(members.map((c) => [c, name(c)])),
			used,
			conditions,
			leftOut
		},
		note: null,
		form
	};
}

/**
 * A Moser–Dutton chain estimate with the uncertainties propagated by Monte Carlo. Costly for
 * long chains (100 centres in a line: about 0.3 s on a busy machine), so it runs in a calculation
 * worker.
 */
export function estimateChain(input: LadderChainInput): ChainEstimate {
	const { chain } = input;
	const hasSigma =
		chain.centres.some((c) => (c.emSigmaMv ?? 0) > 0) ||
		chain.hops.some((h) => (h.edgeSigmaA ?? 0) > 0);
	return {
		result: analyseChain(chain),
		monteCarlo: hasSigma ? monteCarloChain(chain, { samples: CHAIN_SAMPLES, seed: 1 }) : null,
		lambdaEv: chain.lambdaEv,
		conditions: input.conditions,
		entry: chain.entry,
		exit: chain.exit,
		labels: input.labels,
		used: input.used,
		leftOut: input.leftOut,
		edgeDistancesA: chain.hops.map((h) => h.edgeDistanceA)
	};
}
