import type { TitrationResult } from '$lib/science';
import type { HopRateQuery } from '$lib/schemas/calc';
import {
	TITRATION_CAUTION,
	TITRATION_UNITS,
	type HopRateResponse,
	type TitrationResponse,
	type TunnellingResponse
} from '$lib/schemas/calcResponses';
import { RATE_CAUTION, runHopRate } from './hopRate';
import type { TunnellingResult } from './tunnelling';

/*
 * The calculator endpoints' answers, built from a result in one place: the routes send them,
 * and the OpenAPI document's examples are made by the same functions from example inputs.
 */

/** The hop rate under the chosen model, with the inputs as read and their units. */
export function hopRateAnswer(query: HopRateQuery): HopRateResponse {
	const chosen = runHopRate(query).estimates[query.model];
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

export function tunnellingAnswer(result: TunnellingResult): TunnellingResponse {
	return {
		...result,
		units: { energies: 'kcal/mol and cm⁻¹', grid: 'Å', wavefunctions: 'Å^-1/2', massAmu: 'u' },
		caution:
			'One-dimensional model estimates: the parabolic-barrier factors and fixed-potential levels ignore coupling to other coordinates; treat isotope effects as indicative.'
	};
}
