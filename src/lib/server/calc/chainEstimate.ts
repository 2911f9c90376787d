import type { Ladder } from '$lib/catalogue/ladder';
import type { PotentialDto } from '$lib/catalogue/dto';
import type { ChainEstimate } from '$lib/catalogue/chainEstimate';
import { analyseChain, monteCarloChain } from '$lib/science';

/** Default reorganization energy for the chain estimate on protein pages, eV (common practice, no source). */
export const CHAIN_LAMBDA_EV = 0.7;

/**
 * A Moser–Dutton chain estimate along a protein's energy ladder (entry = its low-potential end,
 * exit = the other end), with the potentials' reported uncertainties propagated by Monte Carlo.
 * Null when the ladder has fewer than two centres with potentials.
 */
export function estimateLadderChain(
	ladder: Ladder,
	potentials: Pick<PotentialDto, 'accession' | 'uncertaintyMv'>[]
): ChainEstimate | null {
	const steps = ladder.steps.filter((s) => s.emMv !== null);
	if (steps.length < 2 || steps.length !== ladder.steps.length) return null;
	const uncertainty = new Map(potentials.map((p) => [p.accession, p.uncertaintyMv]));
	const input = {
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
		model: 'moser-dutton' as const
	};
	const result = analyseChain(input);
	const hasSigma = input.centres.some((c) => (c.emSigmaMv ?? 0) > 0);
	return {
		result,
		monteCarlo: hasSigma ? monteCarloChain(input, { samples: 2000, seed: 1 }) : null,
		lambdaEv: CHAIN_LAMBDA_EV,
		labels: Object.fromEntries(ladder.steps.map((s) => [s.centre, s.label]))
	};
}
