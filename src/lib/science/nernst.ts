import { FARADAY_C_PER_MOL, GAS_J_PER_MOL_K, STANDARD_TEMPERATURE_K } from './constants';
import { requireElectronCount, requireFinite, requirePositive } from './guards';

/**
 * The Nernst slope, 2.303·RT/nF, in mV per decade: how far the potential moves for a tenfold
 * change in the ratio [ox]/[red]. 59.16 mV at 25 °C for n = 1.
 * References: W. M. Clark, *Oxidation–Reduction Potentials of Organic Systems* (1960), ch. 1.
 * @throws {RangeError} for a temperature ≤ 0 K or n outside 1–4.
 * @example nernstSlopeMvPerDecade(1, 298.15) // 59.159
 */
export function nernstSlopeMvPerDecade(n = 1, temperatureK = STANDARD_TEMPERATURE_K): number {
	requireElectronCount(n);
	requirePositive(temperatureK, 'temperatureK');
	return ((Math.LN10 * GAS_J_PER_MOL_K * temperatureK) / (n * FARADAY_C_PER_MOL)) * 1000;
}

/**
 * Fraction of a couple in its reduced form at equilibrium with an ambient potential:
 * f_red = 1 / (1 + exp(nF(E − Em)/RT)). Exactly ½ at E = Em.
 * References: Nernst equation, E = Em + (RT/nF) ln([ox]/[red]); Clark (1960).
 * @param potentialMv ambient potential, mV (same reference as emMv)
 * @param emMv midpoint potential, mV
 * @throws {TypeError} for non-finite input. @throws {RangeError} for T ≤ 0 or n outside 1–4.
 * @example nernstFractionReduced(-300, -300, 1, 298.15) // 0.5
 */
export function nernstFractionReduced(
	potentialMv: number,
	emMv: number,
	n = 1,
	temperatureK = STANDARD_TEMPERATURE_K
): number {
	requireFinite(potentialMv, 'potentialMv');
	requireFinite(emMv, 'emMv');
	requireElectronCount(n);
	requirePositive(temperatureK, 'temperatureK');
	const exponent =
		(n * FARADAY_C_PER_MOL * (potentialMv - emMv)) / 1000 / (GAS_J_PER_MOL_K * temperatureK);
	// exp overflows above ~709; the fraction is 0 to double precision long before that.
	if (exponent > 700) return 0;
	return 1 / (1 + Math.exp(exponent));
}
