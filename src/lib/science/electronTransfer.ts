import {
	BOLTZMANN_EV_PER_K,
	ELEMENTARY_CHARGE_C,
	HBAR_J_S,
	STANDARD_TEMPERATURE_K
} from './constants';
import { requireElectronCount, requireFinite, requireInRange, requirePositive } from './guards';

/*
 * Electron-transfer rate estimates between two redox centres. Sign convention throughout:
 * ΔG° < 0 is downhill (exergonic) for the direction asked about. Energies in eV, distances in Å,
 * rates in s⁻¹. These are model estimates, typically good to about an order of magnitude; every
 * result carries warnings for inputs outside the range where the model was validated.
 */

export interface RateResult {
	/** s⁻¹ */
	rate: number;
	log10Rate: number;
	warnings: string[];
}

/** From log10 k: never Infinity or NaN (rates below 1e-300 s⁻¹ read as 0). */
function fromLog10(log10Rate: number, warnings: string[]): RateResult {
	return { rate: log10Rate < -300 ? 0 : 10 ** log10Rate, log10Rate, warnings };
}

/** The van der Waals contact distance at which the Moser–Dutton ruler is anchored, Å. */
export const MOSER_DUTTON_CONTACT_A = 3.6;

/**
 * How many decades a hop's uphill rate lies below its downhill rate, by detailed balance
 * (microscopic reversibility) at temperature T:
 *
 *   log10(k_down / k_up) = |ΔG°| / (k_B T ln 10)
 *
 * the one uphill rule of Hopline (the hop-rate calculator, the ruler and the chain kinetics).
 * At 298.15 K one decade is 59.16 mV; the published ruler's 0.06 eV per decade is this rule at
 * T = 0.06 eV / (k_B ln 10) ≈ 302.4 K (Page et al. 1999).
 * References: detailed balance, k_f/k_b = exp(−ΔG°/k_BT); k_B and e from CODATA 2018.
 * @throws {TypeError} for non-finite input. @throws {RangeError} for T ≤ 0.
 * @example detailedBalanceDecades(0.1, 298.15) // ≈ 1.690
 */
export function detailedBalanceDecades(deltaGEv: number, temperatureK: number): number {
	requireFinite(deltaGEv, 'deltaGEv');
	requirePositive(temperatureK, 'temperatureK');
	return Math.abs(deltaGEv) / (BOLTZMANN_EV_PER_K * temperatureK * Math.LN10);
}

export interface MoserDuttonInput {
	/** Edge-to-edge distance between the redox cofactors, Å. */
	edgeDistanceA: number;
	/** Driving force of the hop, eV; negative downhill. */
	deltaGEv: number;
	/** Reorganization energy, eV. */
	lambdaEv: number;
	/** Fraction of the space between the centres filled by protein atoms. @default 0.76 */
	packingDensity?: number;
	/**
	 * Temperature of the uphill direction's detailed balance, K. The downhill (exergonic) rate
	 * does not depend on it: the ruler has no temperature in it. @default 298.15
	 */
	temperatureK?: number;
}

/** Away from room temperature by more than this (K), the ruler is an extrapolation. */
const RULER_TEMPERATURE_SPAN_K = 30;

/**
 * The Moser–Dutton ruler, log10 k in s⁻¹:
 *
 *   exergonic (ΔG° ≤ 0): 13 − (1.2 − 0.8ρ)(R − 3.6) − 3.1 (ΔG° + λ)²/λ
 *   endergonic (ΔG° > 0): the exergonic rate of the reverse hop (−ΔG°), lowered by detailed
 *     balance at T: − ΔG°/(k_B T ln 10)
 *
 * with R the edge-to-edge distance (Å), ρ the packing density, ΔG° and λ in eV. The downhill
 * rate does not depend on temperature (an empirical fit to rates measured near room
 * temperature; a warning is given beyond ±30 K of 298.15 K). The published endergonic form
 * uses −ΔG°/0.06, i.e. detailed balance at ≈302 K; here the uphill term uses the stated T, as
 * the chain kinetics and the hop-rate calculator do (`detailedBalanceDecades`), so at
 * T = 0.06 eV/(k_B ln 10) ≈ 302.4 K the two agree exactly and at 298.15 K they differ by
 * 0.24 decades per eV of ΔG°. Empirical; fitted at room temperature.
 * References: C. C. Moser, J. M. Keske, K. Warncke, R. S. Farid & P. L. Dutton, Nature 355, 796
 * (1992); C. C. Page, C. C. Moser, X. Chen & P. L. Dutton, Nature 402, 47–52 (1999), eqs. 1–2
 * (the room-temperature endergonic form this reproduces at ≈302 K).
 * @throws {TypeError} for non-finite input. @throws {RangeError} for λ ≤ 0, ρ outside 0–1,
 * a negative distance, T ≤ 0.
 * @example moserDuttonLog10Rate({ edgeDistanceA: 3.6, deltaGEv: -0.7, lambdaEv: 0.7 }).log10Rate // 13
 */
export function moserDuttonLog10Rate(input: MoserDuttonInput): RateResult {
	const { edgeDistanceA: r, deltaGEv: dg, lambdaEv: lambda } = input;
	const rho = input.packingDensity ?? 0.76;
	const t = input.temperatureK ?? STANDARD_TEMPERATURE_K;
	requireFinite(r, 'edgeDistanceA');
	requireFinite(dg, 'deltaGEv');
	requirePositive(lambda, 'lambdaEv');
	requireInRange(rho, 'packingDensity', 0, 1);
	requirePositive(t, 'temperatureK');
	if (r < 0) throw new RangeError(`edgeDistanceA must not be negative, got ${r}`);

	const warnings: string[] = [];
	let distance = r;
	if (r < MOSER_DUTTON_CONTACT_A) {
		warnings.push(
			`Edge-to-edge distance ${r} Å is below van der Waals contact (3.6 Å); the ruler was evaluated at 3.6 Å.`
		);
		distance = MOSER_DUTTON_CONTACT_A;
	}
	if (r > 25) {
		warnings.push(`Distance ${r} Å is beyond the ~25 Å over which the ruler was calibrated.`);
	} else if (r > 14) {
		warnings.push(
			`Distance ${r} Å exceeds 14 Å: tunnelling this far is usually too slow to matter physiologically (Page et al. 1999).`
		);
	}
	if (lambda < 0.3 || lambda > 1.5) {
		warnings.push(
			`λ = ${lambda} eV lies outside 0.3–1.5 eV, the range typical of protein cofactors.`
		);
	}
	if (Math.abs(dg) > 2 * lambda) {
		warnings.push(
			'Driving force exceeds 2λ: deep in the inverted region the empirical parabola is least reliable.'
		);
	}
	if (Math.abs(t - STANDARD_TEMPERATURE_K) > RULER_TEMPERATURE_SPAN_K) {
		warnings.push(
			`The ruler was calibrated on rates near room temperature and its downhill rate has no temperature in it: at ${t} K it is an extrapolation (only the uphill direction uses T, by detailed balance).`
		);
	}
	const decay = (1.2 - 0.8 * rho) * (distance - MOSER_DUTTON_CONTACT_A);
	const downhill = -Math.abs(dg);
	const log10Downhill = 13 - decay - (3.1 * (downhill + lambda) ** 2) / lambda;
	const log10Rate = dg <= 0 ? log10Downhill : log10Downhill - detailedBalanceDecades(dg, t);
	return fromLog10(log10Rate, warnings);
}

/** The Moser–Dutton rate in s⁻¹; same model and warnings as moserDuttonLog10Rate. */
export function moserDuttonRate(input: MoserDuttonInput): RateResult {
	return moserDuttonLog10Rate(input);
}

export interface MarcusInput {
	/** Electronic coupling |H_DA|, eV. */
	couplingEv: number;
	/** Driving force, eV; negative downhill. */
	deltaGEv: number;
	/** Reorganization energy, eV. */
	lambdaEv: number;
	/** @default 298.15 */
	temperatureK?: number;
}

/**
 * Nonadiabatic semiclassical Marcus rate:
 *
 *   k = (2π/ħ) |H_DA|² (4πλk_BT)^(−1/2) exp[−(ΔG° + λ)² / (4λk_BT)]
 *
 * Maximal at −ΔG° = λ; symmetric in ΔG° about that point (the inverted region).
 * References: R. A. Marcus & N. Sutin, Biochim. Biophys. Acta 811, 265 (1985), eq. 26;
 * constants CODATA 2018.
 * @throws {TypeError} for non-finite input. @throws {RangeError} for λ ≤ 0, T ≤ 0, coupling ≤ 0.
 * @example marcusRate({ couplingEv: 0.01, deltaGEv: -1, lambdaEv: 1 }).rate // ≈ 1.68e12
 */
export function marcusRate(input: MarcusInput): RateResult {
	const { couplingEv: h, deltaGEv: dg, lambdaEv: lambda } = input;
	const t = input.temperatureK ?? STANDARD_TEMPERATURE_K;
	requirePositive(h, 'couplingEv');
	requireFinite(dg, 'deltaGEv');
	requirePositive(lambda, 'lambdaEv');
	requirePositive(t, 'temperatureK');
	const kT = BOLTZMANN_EV_PER_K * t;
	const warnings: string[] = [];
	if (h >= kT / 2) {
		warnings.push(
			`Coupling ${h} eV is not small against k_BT/2 (${(kT / 2).toFixed(4)} eV): the transfer approaches the adiabatic regime and the nonadiabatic rate is an overestimate.`
		);
	}
	if (-dg > 1.5 * lambda) {
		warnings.push(
			'Deep in the inverted region (−ΔG° > 1.5λ) the classical treatment of nuclear motion underestimates rates; high-frequency modes open tunnelling channels.'
		);
	}
	if (h === 0)
		return {
			rate: 0,
			log10Rate: Number.NEGATIVE_INFINITY,
			warnings: [...warnings, 'Zero coupling: no transfer.']
		};
	const hbarEvS = HBAR_J_S / ELEMENTARY_CHARGE_C;
	const log10Prefactor = Math.log10(
		(2 * Math.PI * h * h) / hbarEvS / Math.sqrt(4 * Math.PI * lambda * kT)
	);
	const log10Rate = log10Prefactor - (dg + lambda) ** 2 / (4 * lambda * kT) / Math.LN10;
	return fromLog10(log10Rate, warnings);
}

/**
 * Exponential decay of electronic coupling with distance: H(R) = H₀ exp[−β(R − R₀)/2]
 * (β describes the decay of the rate, hence β/2 for the coupling).
 * References: Moser et al., Nature 355, 796 (1992); Gray & Winkler, Q. Rev. Biophys. 36, 341 (2003).
 * @example couplingAtDistance({ h0Ev: 0.02, betaPerA: 1.4, r0A: 3.6, distanceA: 3.6 }) // 0.02
 */
export function couplingAtDistance(input: {
	h0Ev: number;
	betaPerA: number;
	/** @default 3.6 */
	r0A?: number;
	distanceA: number;
}): number {
	const r0 = input.r0A ?? MOSER_DUTTON_CONTACT_A;
	requireFinite(input.h0Ev, 'h0Ev');
	requireFinite(input.betaPerA, 'betaPerA');
	requireFinite(r0, 'r0A');
	requireFinite(input.distanceA, 'distanceA');
	if (input.h0Ev < 0) throw new RangeError(`h0Ev must not be negative, got ${input.h0Ev}`);
	if (input.betaPerA < 0)
		throw new RangeError(`betaPerA must not be negative, got ${input.betaPerA}`);
	return input.h0Ev * Math.exp((-input.betaPerA * (input.distanceA - r0)) / 2);
}

export type RateModel = 'moser-dutton' | 'marcus';

export interface HopRatePairInput {
	model: RateModel;
	/** Edge-to-edge distance, Å. */
	edgeDistanceA: number;
	/** Driving force of the forward hop, eV; negative downhill. */
	deltaGEv: number;
	/** Reorganization energy, eV. */
	lambdaEv: number;
	/** @default 298.15 */
	temperatureK?: number;
	/** Moser–Dutton only. @default 0.76 */
	packingDensity?: number;
	/** Marcus only (required for it): coupling at r0A and its distance decay. */
	coupling?: { h0Ev: number; betaPerA: number; r0A?: number };
}

export interface HopRatePair {
	/** s⁻¹ (0 below 1e-300). */
	forward: number;
	backward: number;
	log10Forward: number;
	log10Backward: number;
	/** The model's warnings for the hop (evaluated on its downhill direction). */
	warnings: string[];
}

/**
 * Both directions of one hop: the downhill direction from the rate model, the uphill one from
 * it by detailed balance at T (`detailedBalanceDecades`). For Marcus this equals the Marcus
 * expression evaluated uphill (it obeys detailed balance by itself); for the ruler it is the
 * ruler's endergonic form with the stated T in place of the published 0.06 eV per decade.
 * References: as moserDuttonLog10Rate, marcusRate and couplingAtDistance.
 * @throws {TypeError} for non-finite input or a Marcus hop without coupling.
 * @throws {RangeError} as the model functions.
 * @example hopRatePair({ model: 'moser-dutton', edgeDistanceA: 10, deltaGEv: 0.1, lambdaEv: 0.7 })
 */
export function hopRatePair(input: HopRatePairInput): HopRatePair {
	const t = input.temperatureK ?? STANDARD_TEMPERATURE_K;
	const downhill = -Math.abs(input.deltaGEv);
	let down: RateResult;
	if (input.model === 'moser-dutton') {
		down = moserDuttonLog10Rate({
			edgeDistanceA: input.edgeDistanceA,
			deltaGEv: downhill,
			lambdaEv: input.lambdaEv,
			packingDensity: input.packingDensity,
			temperatureK: t
		});
	} else {
		if (!input.coupling) throw new TypeError('a Marcus hop needs its coupling (h0Ev, betaPerA)');
		down = marcusRate({
			couplingEv: couplingAtDistance({ ...input.coupling, distanceA: input.edgeDistanceA }),
			deltaGEv: downhill,
			lambdaEv: input.lambdaEv,
			temperatureK: t
		});
	}
	const log10Up = down.log10Rate - detailedBalanceDecades(downhill, t);
	const up = fromLog10(log10Up, []).rate;
	return input.deltaGEv <= 0
		? {
				forward: down.rate,
				backward: up,
				log10Forward: down.log10Rate,
				log10Backward: log10Up,
				warnings: down.warnings
			}
		: {
				forward: up,
				backward: down.rate,
				log10Forward: log10Up,
				log10Backward: down.log10Rate,
				warnings: down.warnings
			};
}

/**
 * Driving force of moving n electrons from donor to acceptor, eV: ΔG° = −n (Em,acc − Em,don).
 * @example deltaGFromPotentials(-400, -250) // −0.15 (downhill)
 */
export function deltaGFromPotentials(donorEmMv: number, acceptorEmMv: number, n = 1): number {
	requireFinite(donorEmMv, 'donorEmMv');
	requireFinite(acceptorEmMv, 'acceptorEmMv');
	requireElectronCount(n);
	return (-n * (acceptorEmMv - donorEmMv)) / 1000;
}

/**
 * The rate of the reverse hop by detailed balance: k_back = k_fwd · exp(ΔG°/k_BT), with ΔG° the
 * driving force of the forward hop (negative downhill, so the reverse is slower).
 * References: detailed balance / microscopic reversibility, k_f/k_b = exp(−ΔG°/k_BT).
 * @example reverseRate(1e6, 0, 298.15) // 1e6
 */
export function reverseRate(
	forwardRate: number,
	deltaGEv: number,
	temperatureK = STANDARD_TEMPERATURE_K
): number {
	requireFinite(forwardRate, 'forwardRate');
	if (forwardRate < 0) throw new RangeError(`forwardRate must not be negative, got ${forwardRate}`);
	requireFinite(deltaGEv, 'deltaGEv');
	requirePositive(temperatureK, 'temperatureK');
	const exponent = deltaGEv / (BOLTZMANN_EV_PER_K * temperatureK);
	if (exponent > 700) throw new RangeError('the reverse rate overflows: ΔG°/k_BT > 700');
	return forwardRate * Math.exp(exponent);
}
