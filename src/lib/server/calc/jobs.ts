import {
	fitNernst,
	pairsWithinCutoff,
	readStructureText,
	type CofactorGroup,
	type StructurePair,
	type StructureCentre,
	type StructureReading,
	type FitOptions,
	type TitrationPoint,
	type TitrationResult
} from '$lib/science';
import type { ChainEstimate } from '$lib/catalogue/chainEstimate';
import type { TunnellingRequest } from '$lib/schemas/calc';
import { estimateChain, type LadderChainInput } from './chainEstimate';
import { runTunnelling, type TunnellingResult } from './tunnelling';

/*
 * The calculations that run in worker threads: each a message that survives structured cloning
 * (plain data in, plain data out). Pure: the worker (calc.worker.ts) calls `runCalcJob`.
 */
export type CalcJob =
	| { kind: 'titration'; points: TitrationPoint[]; options: FitOptions }
	| { kind: 'tunnelling'; request: TunnellingRequest }
	| { kind: 'chain'; input: LadderChainInput }
	| { kind: 'structure'; text: string; centres: StructureCentre[] }
	| { kind: 'structurePairs'; groups: CofactorGroup[]; cutoffA: number };

/** The result of each kind of job. */
export interface CalcResults {
	titration: TitrationResult;
	tunnelling: TunnellingResult;
	chain: ChainEstimate;
	structure: StructureReading;
	structurePairs: StructurePair[];
}

export type CalcKind = CalcJob['kind'];

export function runCalcJob(job: CalcJob): CalcResults[CalcKind] {
	switch (job.kind) {
		case 'titration':
			return fitNernst(job.points, job.options);
		case 'tunnelling':
			return runTunnelling(job.request);
		case 'chain':
			return estimateChain(job.input);
		case 'structure':
			return readStructureText(job.text, job.centres);
		case 'structurePairs':
			return pairsWithinCutoff(job.groups, { cutoffA: job.cutoffA });
	}
}
