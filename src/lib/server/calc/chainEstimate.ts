import type { Ladder } from '$lib/catalogue/ladder';
import type { PotentialDto } from '$lib/catalogue/dto';
import type { ChainEstimate } from '$lib/catalogue/chainEstimate';
import { analyseChain, monteCarloChain, type ChainInput } from '$lib/science';

/** Default reorganization energy for the chain estimate on protein pages, eV (common practice, no source). */
export const CHAIN_LAMBDA_EV = 0.7;

/** Monte Carlo samples over the reported uncertainties (seeded, so the estimate is repeatable). */
const CHAIN_SAMPLES = 2000;

/** What the chain estimate of a protein page is computed from: the chain and the centres' labels. */
export interface LadderChainInput {
	chain: ChainInput;
	labels: Record<string, string>;
}

/**
 * The chain along a protein's energy ladder (entry = its low-potential end, exit = the other
 * end), with the potentials' reported uncertainties. Null when the ladder has fewer than two
 * centres or a centre without a potential. Cheap: the computation is `estimateChain`.
 */
export function ladderChainInput(
	ladder: Ladder,
	potentials: Pick<PotentialDto, 'accession' | 'uncertaintyMv'>[]
): LadderChainInput | null {
	const steps = ladder.steps.filter((s) => s.emMv !== null);
	if (steps.length < 2 || steps.length !== ladder.steps.length) return null;
	const uncertainty = new Map(potentials.map((p) => [p.accession, p.uncertaintyMv]));
	return {
		chain: {
			centres: steps.map((s) => ({
				id: s.centre,
				emMv: s.emMv as number,
				emSigmaMv: (s.potential ? uncertainty.get(s.potential) : null) ?? undefined
			})),
			hops: ladder.hops.map((h) => ({ from: h.from, to: h.to, edgeDistanceA: h.edgeA })),
			entry: steps[0]!.centre,
			exit: steps.at(-1)!.centre,
			lambdaEv: CHAIN_LAMBDA_EV,
			temperatureK: 298.15,
			model: 'moser-dutton'
		},
		labels: Object.fromEntries(ladder.steps.map((s) => [s.centre, s.label]))
	};
}

/**
 * A Moser–Dutton chain estimate with the uncertainties propagated by Monte Carlo. Costly for
 * long chains (200 centres: about 3 s), so it runs in a calculation worker.
 */
export function estimateChain({ chain, labels }: LadderChainInput): ChainEstimate {
	const hasSigma = chain.centres.some((c) => (c.emSigmaMv ?? 0) > 0);
	return {
		result: analyseChain(chain),
		monteCarlo: hasSigma ? monteCarloChain(chain, { samples: CHAIN_SAMPLES, seed: 1 }) : null,
		lambdaEv: chain.lambdaEv,
		labels
	};
}
