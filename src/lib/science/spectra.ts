import { BOHR_MAGNETON_J_PER_T, PLANCK_J_S, STANDARD_TEMPERATURE_K } from './constants';
import { requireFinite, requirePositive } from './guards';
import { toSHE, type ReferenceElectrode } from './referenceElectrodes';
import { potentialToMv, type PotentialUnit } from './units';

/*
 * The axes of a plotted spectrum: the g-value scale of a continuous-wave EPR spectrum recorded
 * against the magnetic field at a fixed microwave frequency, and the potential axis of a
 * voltammogram put on the SHE scale.
 *
 * EPR resonance condition for an S = 1/2 centre: hν = g·μ_B·B, so g = hν / (μ_B·B) and
 * B = hν / (g·μ_B), with h and μ_B from constants.ts (CODATA 2018). The field is the applied
 * field B₀ in the spectrometer; the g read off this way is an effective g (for a powder, at
 * every field the g of the orientations that resonate there).
 * References: J. A. Weil & J. R. Bolton, *Electron Paramagnetic Resonance*, 2nd ed. (Wiley
 * 2007), eq. 1.9 (from memory).
 *
 * A voltammogram's potential axis is moved to mV vs SHE point by point through the one
 * conversion of the project (referenceElectrodes.ts `toSHE`), so a plotted axis and a stored
 * potential can never disagree about an electrode's offset or its temperature range.
 */

/** Units a field axis may be written in: millitesla, gauss (1 G = 0.1 mT exactly), tesla. */
export const FIELD_UNITS = ['mT', 'G', 'T'] as const;
export type FieldUnit = (typeof FIELD_UNITS)[number];

const MT_PER: Record<FieldUnit, number> = { mT: 1, G: 0.1, T: 1000 };

/**
 * A magnetic field in the given unit, in millitesla.
 * @throws {TypeError} when the value is not finite.
 * @example fieldToMt(3390, 'G') // 339
 */
export function fieldToMt(value: number, unit: FieldUnit): number {
	requireFinite(value, 'field');
	return value * MT_PER[unit];
}

/**
 * The field (mT) at which a centre of the given g resonates at the given microwave frequency.
 * Definition: B = hν / (g·μ_B).
 * References: Weil & Bolton (2007), eq. 1.9; constants CODATA 2018.
 * @throws {TypeError} for a non-finite argument. @throws {RangeError} unless g and ν are > 0.
 * @example resonanceFieldMt(2.0023, 9.5) // ≈ 339.0
 */
export function resonanceFieldMt(g: number, frequencyGHz: number): number {
	requirePositive(g, 'g');
	requirePositive(frequencyGHz, 'frequencyGHz');
	return ((PLANCK_J_S * frequencyGHz * 1e9) / (g * BOHR_MAGNETON_J_PER_T)) * 1000;
}

/**
 * The g-value that resonates at the given field (mT) and microwave frequency (GHz).
 * Definition: g = hν / (μ_B·B); the inverse of resonanceFieldMt.
 * References: Weil & Bolton (2007), eq. 1.9; constants CODATA 2018.
 * @throws {TypeError} for a non-finite argument. @throws {RangeError} unless B and ν are > 0
 * (at zero field g is unbounded).
 * @example gAtField(339.0, 9.5) // ≈ 2.0023
 */
export function gAtField(fieldMt: number, frequencyGHz: number): number {
	requirePositive(fieldMt, 'fieldMt');
	requirePositive(frequencyGHz, 'frequencyGHz');
	return (PLANCK_J_S * frequencyGHz * 1e9) / (BOHR_MAGNETON_J_PER_T * fieldMt * 1e-3);
}

/**
 * A voltammogram's potential axis, measured against `electrode` in `unit`, in mV vs SHE.
 * Definition: each point converted with potentialToMv, then toSHE (referenceElectrodes.ts).
 * @param temperatureK the cell temperature; defaults to 298.15 K. Must lie in the electrode's
 * range (see electrodeOffsetMv), or the conversion is refused rather than guessed.
 * @throws {TypeError} for a non-finite potential or an unknown electrode.
 * @throws {RangeError} for a temperature outside the electrode's range.
 * @example potentialAxisToSheMv([-0.6, -0.4], 'V', 'AgAgCl_sat') // [-403, -203]
 */
export function potentialAxisToSheMv(
	potentials: readonly number[],
	unit: PotentialUnit,
	electrode: ReferenceElectrode,
	temperatureK: number = STANDARD_TEMPERATURE_K
): number[] {
	return potentials.map((e) => toSHE(potentialToMv(e, unit), electrode, temperatureK));
}
