import { FARADAY_C_PER_MOL } from './constants';
import { requireElectronCount, requireFinite, requirePositive } from './guards';

/*
 * Temperature dependence of a midpoint potential from the reaction entropy of reduction:
 *
 *   dEm/dT = ΔS°rc / nF,   so   Em(T) = Em(T₀) + (ΔS°rc / nF)(T − T₀)
 *
 * (ΔS°rc in J mol⁻¹ K⁻¹; the slope in mV/K is 1000·ΔS°/nF). Assumes ΔS° constant over the
 * interval (no heat-capacity change), which holds over the tens of kelvin of typical
 * variable-temperature electrochemistry.
 * References: Gibbs–Helmholtz relation, ΔG° = −nFE°, (∂ΔG°/∂T)p = −ΔS°; G. Battistuzzi et al.,
 * Coord. Chem. Rev. 249, 3209 (2005), for its use with metalloproteins.
 */
export type TemperatureDependence =
	| { emMv: number; referenceTemperatureK: number; reactionEntropyJPerMolK: number; n?: number }
	| { emMv: number; referenceTemperatureK: number; slopeMvPerK: number };

/** dEm/dT in mV/K from a reaction entropy. @example slopeFromEntropy(-96.485) // ≈ −1.0 */
export function slopeFromEntropy(reactionEntropyJPerMolK: number, n = 1): number {
	requireFinite(reactionEntropyJPerMolK, 'reactionEntropyJPerMolK');
	requireElectronCount(n);
	return (reactionEntropyJPerMolK / (n * FARADAY_C_PER_MOL)) * 1000;
}

/**
 * Em at temperatureK, mV.
 * @throws {TypeError} for non-finite values. @throws {RangeError} for temperatures ≤ 0 K.
 * @example emAtTemperature({ emMv: -300, referenceTemperatureK: 298.15, slopeMvPerK: -1 }, 308.15) // −310
 */
export function emAtTemperature(dependence: TemperatureDependence, temperatureK: number): number {
	requireFinite(dependence.emMv, 'emMv');
	requirePositive(dependence.referenceTemperatureK, 'referenceTemperatureK');
	requirePositive(temperatureK, 'temperatureK');
	const slope =
		'slopeMvPerK' in dependence
			? dependence.slopeMvPerK
			: slopeFromEntropy(dependence.reactionEntropyJPerMolK, dependence.n ?? 1);
	requireFinite(slope, 'slopeMvPerK');
	return dependence.emMv + slope * (temperatureK - dependence.referenceTemperatureK);
}
