import type { ChainResult, MonteCarloResult } from '$lib/science';

/** A chain-kinetics estimate along a protein's energy ladder, as its page shows it. */
export interface ChainEstimate {
	result: ChainResult;
	monteCarlo: MonteCarloResult | null;
	lambdaEv: number;
	/** Centre accession → label. */
	labels: Record<string, string>;
}
