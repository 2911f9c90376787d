import {
	FARADAY_C_PER_MOL,
	GAS_J_PER_MOL_K,
	STANDARD_TEMPERATURE_K,
	ZERO_CELSIUS_K
} from './constants';

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
 *
 * SHE and NHE. The SHE is zero at every temperature by convention (IUPAC, *Quantities, Units and
 * Symbols in Physical Chemistry* — the Green Book —, 3rd ed. 2007, §2.13; from memory). Papers
 * that write "vs NHE" almost always mean the SHE, so NHE values are converted with offset 0.
 * The historical normal hydrogen electrode (platinum in 1 N strong acid, hydrogen at 1 atm) is
 * not the SHE: it differs by a few millivolts, nearly all of it from the activity of H⁺ in 1 N
 * acid not being 1 (with γ± ≈ 0.81 for 1 mol/kg HCl at 25 °C, Robinson & Stokes, *Electrolyte
 * Solutions*, from memory: (RT/F)·ln 0.81 ≈ −5.4 mV). The change of standard pressure from 1 atm
 * to 1 bar alone moves the hydrogen electrode by only −(RT/2F)·ln(1.01325) = −0.17 mV at 25 °C
 * (`hydrogenElectrodePressureShiftMv`). A value reported against a true historical NHE may
 * therefore be off by about 5 mV here, less than the uncertainty of most protein potentials.
 *
 * Temperature: each electrode's conversion holds over a stated range only (TEMPERATURE_RANGES),
 * and `electrodeOffsetMv` refuses temperatures outside it with a RangeError:
 * - SHE, NHE: zero at every temperature by the convention above; no bound beyond the
 *   temperature being a finite number.
 * - SCE: the temperature law of Bard & Faulkner, Table C.2 (from memory),
 *   E = 0.2412 − 6.61×10⁻⁴ (t − 25) − 1.75×10⁻⁶ (t − 25)² − 9.0×10⁻¹⁰ (t − 25)³ V, t in °C,
 *   applied between 0 and 70 °C (the range of that law as we apply it, from memory; calomel
 *   electrodes are not used much above 70 °C, where Hg₂Cl₂ starts to disproportionate).
 * - Ag/AgCl (every filling): the offsets are 25 °C values and no temperature law is applied.
 *   Their potentials move by about −0.7 (3.5 M KCl) to −1.0 mV/K (saturated KCl) (Sawyer,
 *   Sobkowiak & Roberts, Table 5.1, from memory), so the 25 °C value is used only from 15 to
 *   35 °C, where the error stays within about ±10 mV — the size of a typical stated
 *   uncertainty. A value measured outside that range must be converted by its authors (or the
 *   contributor) with the electrode's calibration at that temperature and reported vs SHE.
 * `electrodeIsTemperatureCorrected` tells callers which electrodes follow temperature, so the
 * UI can say so beside a converted value.
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

/** The temperatures (°C, inclusive) over which an electrode's conversion holds, and why. */
export interface ElectrodeTemperatureRange {
	/** Lowest temperature, °C; null: no bound. */
	minC: number | null;
	/** Highest temperature, °C; null: no bound. */
	maxC: number | null;
	/** Where the range comes from, in a sentence. */
	basis: string;
}

// The sentences below are shown to readers, so they name what a bound rests on in a reader's
// words; that the three references were quoted from memory, not re-read, is said here and in the
// module notes above.
const HYDROGEN_RANGE: ElectrodeTemperatureRange = {
	minC: null,
	maxC: null,
	// IUPAC Green Book, 3rd ed. 2007, §2.13 (from memory).
	basis: 'zero at every temperature by convention (IUPAC Green Book, 3rd ed. 2007, §2.13)'
};
const AGAGCL_RANGE: ElectrodeTemperatureRange = {
	minC: 15,
	maxC: 35,
	basis:
		// Sawyer, Sobkowiak & Roberts 1995, Table 5.1 (from memory).
		'a 25 °C offset used without a temperature law; its potential moves by about 1 mV per K (handbook value, Sawyer, Sobkowiak & Roberts 1995; approximate), so it is used within ±10 K of 25 °C only'
};

/** Per electrode: the temperature range of its conversion (see the module notes). */
export const TEMPERATURE_RANGES: Record<ReferenceElectrode, ElectrodeTemperatureRange> = {
	SHE: HYDROGEN_RANGE,
	NHE: HYDROGEN_RANGE,
	SCE: {
		minC: 0,
		maxC: 70,
		// Bard & Faulkner (2001), Table C.2 (from memory).
		basis:
			'the temperature law of the electrochemistry handbook of Bard & Faulkner (2001), applied from 0 to 70 °C'
	},
	AgAgCl_sat: AGAGCL_RANGE,
	'AgAgCl_3.5M': AGAGCL_RANGE,
	AgAgCl_3M: AGAGCL_RANGE,
	AgAgCl_1M: AGAGCL_RANGE
};

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

/** The range in words, e.g. "15–35 °C", or "any temperature". */
export function describeTemperatureRange(electrode: ReferenceElectrode): string {
	assertElectrode(electrode);
	const r = TEMPERATURE_RANGES[electrode];
	if (r.minC === null && r.maxC === null) return 'any temperature';
	if (r.minC === null) return `up to ${r.maxC} °C`;
	if (r.maxC === null) return `from ${r.minC} °C`;
	return `${r.minC}–${r.maxC} °C`;
}

/**
 * Why a conversion with `electrode` at `temperatureK` cannot be made, or null when it can.
 * The same test `electrodeOffsetMv` applies, as a message for forms and CSV checks.
 * @throws {TypeError} for an unknown electrode or a non-finite temperature.
 */
export function electrodeTemperatureProblem(
	electrode: ReferenceElectrode,
	temperatureK: number
): string | null {
	assertElectrode(electrode);
	if (!Number.isFinite(temperatureK)) {
		throw new TypeError(`temperatureK must be a finite number, got ${String(temperatureK)}`);
	}
	const r = TEMPERATURE_RANGES[electrode];
	const t = temperatureK - ZERO_CELSIUS_K;
	// A tolerance of 1e-9 °C lets 15 °C typed as 288.15 K through despite binary rounding.
	const below = r.minC !== null && t < r.minC - 1e-9;
	const above = r.maxC !== null && t > r.maxC + 1e-9;
	if (!below && !above) return null;
	return `the ${REFERENCE_ELECTRODE_LABELS[electrode]} conversion holds for ${describeTemperatureRange(electrode)} (${r.basis}); got ${t.toFixed(2)} °C — convert the value to SHE at that temperature and report it vs SHE`;
}

/**
 * Potential of a reference electrode against the SHE, in mV.
 * Definition: the tabulated offset at 25 °C; for the SCE, the temperature law of Bard &
 * Faulkner Table C.2 in (t − 25 °C).
 * References: Bard & Faulkner (2001), Table C.2; Sawyer, Sobkowiak & Roberts (1995), Table 5.1.
 * @param temperatureK defaults to 298.15 K; must lie in the electrode's range (TEMPERATURE_RANGES).
 * @throws {TypeError} for an unknown electrode or a non-finite temperature.
 * @throws {RangeError} for a temperature outside the electrode's range (e.g. Ag/AgCl at 65 °C,
 * the SCE at 80 °C).
 * @example electrodeOffsetMv('AgAgCl_3M') // 210
 */
export function electrodeOffsetMv(
	electrode: ReferenceElectrode,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number {
	const problem = electrodeTemperatureProblem(electrode, temperatureK);
	if (problem !== null) throw new RangeError(problem);
	if (electrode !== 'SCE') return OFFSET_AT_25C_MV[electrode];
	const d = temperatureK - ZERO_CELSIUS_K - 25;
	// Bard & Faulkner Table C.2, in volts; converted to mV.
	return (0.2412 - 6.61e-4 * d - 1.75e-6 * d ** 2 - 9.0e-10 * d ** 3) * 1000;
}

/**
 * The shift of a hydrogen electrode when the hydrogen pressure is `pressureBar` instead of the
 * standard 1 bar, in mV: E = −(RT/2F)·ln(p / 1 bar) (Nernst equation for H⁺ + e⁻ ⇌ ½H₂).
 * At 1 atm (1.01325 bar) and 25 °C: −0.169 mV, the whole of the 1 atm / 1 bar difference
 * between the old and the current standard state.
 * References: Bard & Faulkner (2001), §2.1 (Nernst equation); 1 atm = 1.01325 bar exactly.
 * @throws {RangeError} for a pressure or temperature that is not a positive finite number.
 * @example hydrogenElectrodePressureShiftMv(1.01325) // ≈ -0.169
 */
export function hydrogenElectrodePressureShiftMv(
	pressureBar: number,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number {
	if (!(Number.isFinite(pressureBar) && pressureBar > 0)) {
		throw new RangeError(`pressureBar must be a positive number, got ${String(pressureBar)}`);
	}
	if (!(Number.isFinite(temperatureK) && temperatureK > 0)) {
		throw new RangeError(`temperatureK must be a positive number, got ${String(temperatureK)}`);
	}
	return (
		((-GAS_J_PER_MOL_K * temperatureK) / (2 * FARADAY_C_PER_MOL)) * Math.log(pressureBar) * 1000
	);
}

/**
 * Converts a potential measured against `electrode` to mV vs SHE.
 * Definition: E(SHE) = E(electrode) + E(electrode vs SHE).
 * References: Bard & Faulkner (2001), Table C.2 (see module notes).
 * @throws {TypeError} for an unknown electrode or a non-finite value.
 * @throws {RangeError} for a temperature outside the electrode's range (see electrodeOffsetMv).
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
 * @throws {RangeError} for a temperature outside the electrode's range (see electrodeOffsetMv).
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
