import type { TitrationResult } from '$lib/science';
import type { HopRateQuery } from '$lib/schemas/calc';
import {
	TITRATION_CAUTION,
	TITRATION_UNITS,
	type HopRateResponse,
	type TitrationResponse,
	type TunnellingResponse
} from '$lib/schemas/calcResponses';
import { RATE_CAUTION, estimate } from './hopRate';
import type { TunnellingResult } from './tunnelling';

/*
 * The calculator endpoints' answers, built from a result in one place: the routes send them,
 * and the OpenAPI document's examples are made by the same functions from example inputs.
 */

/** The hop rate under the chosen model, with the inputs as read and their units. */
export function hopRateAnswer(query: HopRateQuery): HopRateResponse {
	// Only the chosen model at the distance asked: the page's second model and curve are not sent.
	const chosen = estimate(query, query.distance, query.model).estimate;
	return {
		model: chosen.model,
		rateForward: chosen.rateForward,
		rateBackward: chosen.rateBackward,
		log10RateForward: chosen.log10RateForward,
		log10RateBackward: chosen.log10RateBackward,
		warnings: chosen.warnings,
		inputs: query,
		units: {
			rate: 's⁻¹',
			distance: 'Å',
			dG: 'eV (negative downhill)',
			lambda: 'eV',
			temperature: 'K'
		},
		caution: RATE_CAUTION
	};
}

/** The fit or the reason there is none, with units and the caution. */
export function titrationAnswer(result: TitrationResult): TitrationResponse {
	return { ...result, units: TITRATION_UNITS, caution: TITRATION_CAUTION };
}

/** What the tunnelling answer's numbers leave out, said beside them on the page and in the API. */
export const TUNNELLING_CAUTION =
	'These numbers come from one-dimensional models. κ models only the barrier top as a parabola: Wigner’s term is within 2 % of it for u ≤ 2, Bell’s infinite parabola holds for u < 2π, and below the crossover temperature the truncated form is an order of magnitude at best. The levels are those of a fixed potential, converged numerically as the grid report says; the error of the model itself (coupling to other coordinates) is not estimated here. The isotope effect, (Δ_H/Δ_D)², is an order of magnitude, and only for vibrationally nonadiabatic transfer.';

export function tunnellingAnswer(result: TunnellingResult): TunnellingResponse {
	return {
		...result,
		units: {
			energies: 'kcal/mol (fields named …KcalMol) and cm⁻¹ (…Cm1)',
			barrierKJmol: 'kJ/mol',
			grid: 'Å',
			wavefunctions: 'Å^-1/2',
			massAmu: 'u',
			temperature: 'K'
		},
		caution: TUNNELLING_CAUTION
	};
}
