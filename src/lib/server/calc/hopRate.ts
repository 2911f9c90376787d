import {
	BOLTZMANN_EV_PER_K,
	couplingAtDistance,
	defaultChainCoupling,
	marcusRate,
	moserDuttonLog10Rate,
	type RateResult
} from '$lib/science';
import type { HopRateQuery } from '$lib/schemas/calc';

/** One hop under one model: forward from ΔG°, backward by detailed balance at T. */
export interface HopRateEstimate {
	model: 'moser-dutton' | 'marcus';
	rateForward: number;
	rateBackward: number;
	log10RateForward: number;
	log10RateBackward: number;
	warnings: string[];
}

export interface HopRateResult {
	estimates: Record<'moser-dutton' | 'marcus', HopRateEstimate>;
	coupling: { h0Ev: number; betaPerA: number; atDistanceEv: number };
	/** log10 of the forward rate against edge-to-edge distance, for the plot. */
	curve: { distanceA: number; moserDutton: number; marcus: number }[];
}

function estimate(q: HopRateQuery, distanceA: number, model: 'moser-dutton' | 'marcus') {
	const coupling = {
		...defaultChainCoupling(q.lambda, q.temperature, q.packing),
		...(q.h0 !== undefined ? { h0Ev: q.h0 } : {}),
		...(q.beta !== undefined ? { betaPerA: q.beta } : {})
	};
	const rate = (dg: number): RateResult =>
		model === 'moser-dutton'
			? moserDuttonLog10Rate({
					edgeDistanceA: distanceA,
					deltaGEv: dg,
					lambdaEv: q.lambda,
					packingDensity: q.packing
				})
			: marcusRate({
					couplingEv: couplingAtDistance({ ...coupling, distanceA }),
					deltaGEv: dg,
					lambdaEv: q.lambda,
					temperatureK: q.temperature
				});
	// The downhill direction comes from the model, the uphill one from detailed balance at T.
	const down = rate(-Math.abs(q.dG));
	const uphillShift = Math.abs(q.dG) / (BOLTZMANN_EV_PER_K * q.temperature) / Math.LN10;
	const forwardIsDown = q.dG <= 0;
	const log10Forward = forwardIsDown ? down.log10Rate : down.log10Rate - uphillShift;
	const log10Backward = forwardIsDown ? down.log10Rate - uphillShift : down.log10Rate;
	const warnings = [...down.warnings];
	if (model === 'moser-dutton' && Math.abs(q.temperature - 298.15) > 30) {
		warnings.push('The Moser–Dutton ruler was calibrated near room temperature.');
	}
	const toRate = (log10: number) => (log10 < -300 ? 0 : 10 ** log10);
	return {
		estimate: {
			model,
			rateForward: toRate(log10Forward),
			rateBackward: toRate(log10Backward),
			log10RateForward: log10Forward,
			log10RateBackward: log10Backward,
			warnings
		},
		coupling
	};
}

export function runHopRate(q: HopRateQuery): HopRateResult {
	const md = estimate(q, q.distance, 'moser-dutton');
	const marcus = estimate(q, q.distance, 'marcus');
	const curve = Array.from({ length: 35 }, (_, i) => 3.6 + i * 0.5).map((d) => ({
		distanceA: d,
		moserDutton: estimate(q, d, 'moser-dutton').estimate.log10RateForward,
		marcus: estimate(q, d, 'marcus').estimate.log10RateForward
	}));
	return {
		estimates: { 'moser-dutton': md.estimate, marcus: marcus.estimate },
		coupling: {
			h0Ev: marcus.coupling.h0Ev,
			betaPerA: marcus.coupling.betaPerA,
			atDistanceEv: couplingAtDistance({ ...marcus.coupling, distanceA: q.distance })
		},
		curve
	};
}

export const RATE_CAUTION =
	'Model estimates, not measurements: empirical and semiclassical rates are typically good to about an order of magnitude. ' +
	'The Moser–Dutton ruler was calibrated on protein electron transfer at room temperature over roughly 4–25 Å; ' +
	'the Marcus rate assumes weak (nonadiabatic) coupling and classical nuclear motion.';
