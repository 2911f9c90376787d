import { STANDARD_TEMPERATURE_K, ZERO_CELSIUS_K } from './constants';

/*
 * Reference electrodes that redox potentials of proteins are reported against, and conversion
 * of a potential between any of them and the standard hydrogen electrode (SHE).
 *
 * E(vs SHE) = E(vs reference) + E(reference vs SHE).
 *
 * Offsets at 25 °C (mV vs SHE), as tabulated in A. J. Bard & L. R. Faulkner, *Electrochemical
 * Methods*, 2nd ed. (Wiley 2001), Table C.2, and D. T. Sawyer, A. Sobkowiak & J. L. Roberts,
 * *Electrochemistry for Chemists*, 2nd ed. (Wiley 1995), Table 5.1 (values from memory of those
 * tables; they agree with the figures electrode makers print on their data sheets):
 *   SCE (saturated KCl) +241.2 · Ag/AgCl sat. KCl +197 · Ag/AgCl 3.5 M KCl +205 ·
 *   Ag/AgCl 3 M KCl +210 · Ag/AgCl 1 M KCl +235.
 * NHE is taken as identical to SHE, as is common practice (the two differ by well under 1 mV).
 *
 * Temperature: only the SCE has a published temperature law here (Bard & Faulkner, Table C.2:
 * E = 0.2412 − 6.61×10⁻⁴ (t − 25) − 1.75×10⁻⁶ (t − 25)² − 9.0×10⁻¹⁰ (t − 25)³ V, t in °C, from
 * memory), applied between 0 and 70 °C. The Ag/AgCl offsets are 25 °C values only and are used
 * at every temperature; `electrodeIsTemperatureCorrected` tells callers which case applies so
 * the UI can say so beside a converted value.
 */

export const REFERENCE_ELECTRODES = [
	'SHE',
	'NHE',
	'SCE',
	'AgAgCl_sat',
	'AgAgCl_3.5M',
	'AgAgCl_3M',
	'AgAgCl_1M'
] as const;
export type ReferenceElectrode = (typeof REFERENCE_ELECTRODES)[number];

export const REFERENCE_ELECTRODE_LABELS: Record<ReferenceElectrode, string> = {
	SHE: 'SHE',
	NHE: 'NHE',
	SCE: 'SCE (saturated KCl)',
	AgAgCl_sat: 'Ag/AgCl (saturated KCl)',
	'AgAgCl_3.5M': 'Ag/AgCl (3.5 M KCl)',
	AgAgCl_3M: 'Ag/AgCl (3 M KCl)',
	AgAgCl_1M: 'Ag/AgCl (1 M KCl)'
};

const OFFSET_AT_25C_MV: Record<ReferenceElectrode, number> = {
	SHE: 0,
	NHE: 0,
	SCE: 241.2,
	AgAgCl_sat: 197,
	'AgAgCl_3.5M': 205,
	AgAgCl_3M: 210,
	AgAgCl_1M: 235
};

const SCE_LAW_MIN_C = 0;
const SCE_LAW_MAX_C = 70;

function assertElectrode(electrode: string): asserts electrode is ReferenceElectrode {
	if (!(REFERENCE_ELECTRODES as readonly string[]).includes(electrode)) {
		throw new TypeError(
			`unknown reference electrode "${electrode}"; expected one of ${REFERENCE_ELECTRODES.join(', ')}`
		);
	}
}

/** True when the electrode's offset follows temperature (the SCE); false for 25 °C-only values. */
export function electrodeIsTemperatureCorrected(electrode: ReferenceElectrode): boolean {
	return electrode === 'SCE';
}

/**
 * Potential of a reference electrode against the SHE, in mV.
 * @param temperatureK defaults to 298.15 K; used by the SCE only (see module notes).
 * @throws {TypeError} for an unknown electrode or a non-finite temperature.
 * @throws {RangeError} for an SCE temperature outside 0–70 °C.
 * @example electrodeOffsetMv('AgAgCl_3M') // 210
 */
export function electrodeOffsetMv(
	electrode: ReferenceElectrode,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number {
	assertElectrode(electrode);
	if (!Number.isFinite(temperatureK)) {
		throw new TypeError(`temperatureK must be a finite number, got ${String(temperatureK)}`);
	}
	if (electrode !== 'SCE') return OFFSET_AT_25C_MV[electrode];
	const t = temperatureK - ZERO_CELSIUS_K;
	if (t < SCE_LAW_MIN_C || t > SCE_LAW_MAX_C) {
		throw new RangeError(
			`the SCE temperature law covers ${SCE_LAW_MIN_C}–${SCE_LAW_MAX_C} °C; got ${t.toFixed(2)} °C`
		);
	}
	const d = t - 25;
	// Bard & Faulkner Table C.2, in volts; converted to mV.
	return (0.2412 - 6.61e-4 * d - 1.75e-6 * d ** 2 - 9.0e-10 * d ** 3) * 1000;
}

/**
 * Converts a potential measured against `electrode` to mV vs SHE.
 * Definition: E(SHE) = E(electrode) + E(electrode vs SHE).
 * References: Bard & Faulkner (2001), Table C.2 (see module notes).
 * @throws {TypeError} for an unknown electrode or a non-finite value.
 * @example toSHE(-600, 'AgAgCl_sat') // -403
 */
export function toSHE(
	valueMv: number,
	electrode: ReferenceElectrode,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number {
	if (!Number.isFinite(valueMv)) {
		throw new TypeError(`valueMv must be a finite number, got ${String(valueMv)}`);
	}
	return valueMv + electrodeOffsetMv(electrode, temperatureK);
}

/**
 * Converts a potential in mV vs SHE to mV against `electrode`; the inverse of toSHE.
 * @throws {TypeError} for an unknown electrode or a non-finite value.
 * @example fromSHE(-403, 'AgAgCl_sat') // -600
 */
export function fromSHE(
	valueMv: number,
	electrode: ReferenceElectrode,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number {
	if (!Number.isFinite(valueMv)) {
		throw new TypeError(`valueMv must be a finite number, got ${String(valueMv)}`);
	}
	return valueMv - electrodeOffsetMv(electrode, temperatureK);
}
