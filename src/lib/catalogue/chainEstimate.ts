import type { ChainResult, MonteCarloResult } from '$lib/science';
import type { ChainConditions } from '$lib/schemas/chainConditions';

/** What a centre does in the chain: the entry gives up the electron, the others take it on. */
export type ChainRole = 'entry' | 'relay' | 'exit';

/** The potential a chain estimate used for one centre, with the conditions it was measured at. */
export interface UsedPotential {
	centre: string;
	label: string;
	role: ChainRole;
	/** The potential's accession. */
	potential: string;
	couple: string;
	emMv: number;
	uncertaintyMv: number | null;
	ph: number | null;
	temperatureK: number | null;
	/**
	 * Set when this couple stands in for the one the role needs: `mark` for each hop it enters,
	 * `detail` saying which couple was wanted. Null when it is that one.
	 */
	approximation: { mark: string; detail: string } | null;
}

/** A chain-kinetics estimate on a protein page, as its page shows it. */
export interface ChainEstimate {
	result: ChainResult;
	monteCarlo: MonteCarloResult | null;
	lambdaEv: number;
	conditions: ChainConditions;
	/** Centre accessions. */
	entry: string;
	exit: string;
	/** Centre accession → label. */
	labels: Record<string, string>;
	/** The potential used for each centre of the chain, by centre accession. */
	used: Record<string, UsedPotential>;
	/** Labels of centres next to the chain that have no potential the reader can see (left out). */
	leftOut: string[];
	/** Edge-to-edge distance of each hop of result.hops, Å. */
	edgeDistancesA: number[];
}

/** The entry and exit choice of a protein page's chain estimate. */
export interface ChainForm {
	/** Centres that may end a chain: those with a potential and a neighbour within 14 Å. */
	options: { accession: string; label: string }[];
	entry: string;
	exit: string;
	conditions: ChainConditions;
	/** True when the reader chose (the query named entry, exit, pH or temperature). */
	chosen: boolean;
}
