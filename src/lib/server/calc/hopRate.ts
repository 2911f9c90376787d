import {
	BOLTZMANN_EV_PER_K,
	MOSER_DUTTON_CONTACT_A,
	couplingAtDistance,
	defaultChainCoupling,
	detailedBalanceDecades,
	hopRatePair,
	type RateModel
} from '$lib/science';
import type { HopRateQuery } from '$lib/schemas/calc';

/** One hop under one model: the downhill direction from the model, the uphill one by detailed balance at T. */
export interface HopRateEstimate {
	model: RateModel;
	rateForward: number;
	rateBackward: number;
	log10RateForward: number;
	log10RateBackward: number;
	warnings: string[];
}

export interface HopRateResult {
	estimates: Record<'moser-dutton' | 'marcus', HopRateEstimate>;
	coupling: { h0Ev: number; betaPerA: number; atDistanceEv: number };
	/**
	 * Detailed balance at T, the one uphill rule: the uphill rate lies `decades` below the
	 * downhill one, k_BT·ln 10 = `evPerDecade` eV of |ΔG°| per decade.
	 */
	detailedBalance: { decades: number; evPerDecade: number };
	/** log10 of the forward rate against edge-to-edge distance, for the plot. */
	curve: { distanceA: number; moserDutton: number; marcus: number }[];
}

/** One model's rates at one distance, and the Marcus coupling it used. */
export function estimate(q: HopRateQuery, distanceA: number, model: RateModel) {
	const coupling = {
		...defaultChainCoupling(q.lambda, q.temperature, q.packing),
		...(q.h0 !== undefined ? { h0Ev: q.h0 } : {}),
		...(q.beta !== undefined ? { betaPerA: q.beta } : {})
	};
	// The downhill direction comes from the model, the uphill one by detailed balance at T.
	const rates = hopRatePair({
		model,
		edgeDistanceA: distanceA,
		deltaGEv: q.dG,
		lambdaEv: q.lambda,
		temperatureK: q.temperature,
		packingDensity: q.packing,
		coupling
	});
	return {
		estimate: {
			model,
			rateForward: rates.forward,
			rateBackward: rates.backward,
			log10RateForward: rates.log10Forward,
			log10RateBackward: rates.log10Backward,
			warnings: rates.warnings
		},
		coupling
	};
}

/** The plot's distances: from contact to 20.6 Å, or past the distance asked about. */
function curveDistances(distanceA: number): number[] {
	const last = Math.max(MOSER_DUTTON_CONTACT_A + 17, distanceA);
	const step = (last - MOSER_DUTTON_CONTACT_A) / 34;
	return Array.from({ length: 35 }, (_, i) => MOSER_DUTTON_CONTACT_A + i * step);
}

export function runHopRate(q: HopRateQuery): HopRateResult {
	const md = estimate(q, q.distance, 'moser-dutton');
	const marcus = estimate(q, q.distance, 'marcus');
	const curve = curveDistances(q.distance).map((d) => ({
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
		detailedBalance: {
			decades: detailedBalanceDecades(q.dG, q.temperature),
			evPerDecade: BOLTZMANN_EV_PER_K * q.temperature * Math.LN10
		},
		curve
	};
}

/**
 * What each model is, where it holds and how far to trust it: shown beside every computed
 * estimate (page) and sent with it (API).
 */
export const RATE_VALIDITY = [
	{
		model: 'Moser–Dutton ruler',
		text:
			'empirical, fitted to protein electron-transfer rates measured near room temperature over roughly 4–25 Å edge to edge, with λ typically 0.3–1.5 eV (Moser et al., Nature 355, 796 (1992); Page et al., Nature 402, 47 (1999)). ' +
			// How far to trust it: common practice, no published source (so said to readers in plain words).
			'Expect it to be right to about an order of magnitude either way (a common rule of thumb, not a published figure). ' +
			'Its downhill rate has no temperature in it; only the uphill rate uses T, by detailed balance.'
	},
	{
		model: 'Marcus (nonadiabatic)',
		text:
			'assumes weak electronic coupling (well below the thermal energy k_BT) and classical nuclear motion, so it underestimates rates deep in the inverted region; ' +
			'it is only as good as the coupling assumed (by default calibrated to the ruler at contact, 10¹³ s⁻¹ at 3.6 Å).'
	}
] as const;

export const RATE_CAUTION =
	'Model estimates, not measurements. ' +
	RATE_VALIDITY.map((v) => `${v.model}: ${v.text}`).join(' ');
