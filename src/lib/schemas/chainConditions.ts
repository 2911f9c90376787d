/*
 * The conditions of a protein page's chain estimate: their ranges and defaults, apart from the
 * query's schema (chainChoice.ts) so that the page, which states the ranges, loads no schema
 * library.
 */

/** pH of the conditions the potentials are chosen for: the scale's usual range. */
export const CHAIN_PH_RANGE = { min: 0, max: 14 } as const;
/**
 * Temperature of the estimate, K: liquid water at ordinary pressure (0–100 °C). Detailed balance
 * is applied at this temperature; the ruler's forward rates do not depend on it.
 */
export const CHAIN_TEMPERATURE_RANGE = { min: 273.15, max: 373.15 } as const;

export const DEFAULT_CHAIN_CONDITIONS = { ph: 7, temperatureK: 298.15 } as const;

export interface ChainConditions {
	ph: number;
	temperatureK: number;
}
