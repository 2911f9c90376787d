import { describe, expect, it } from 'vitest';
import { emAtTemperature, slopeFromEntropy } from '$lib/science';

describe('temperature dependence', () => {
	// dEm/dT = ΔS°/nF (Gibbs–Helmholtz); F = 96 485.332 C/mol (CODATA 2018): ΔS° = −F J/(mol K) gives −1 mV/K.
	it('ΔS° = −96.485 J/(mol K) is −1.000 mV/K', () =>
		expect(slopeFromEntropy(-96.48533212)).toBeCloseTo(-1, 9));
	it('extrapolates linearly from the reference temperature', () => {
		expect(
			emAtTemperature({ emMv: -300, referenceTemperatureK: 298.15, slopeMvPerK: -1 }, 308.15)
		).toBeCloseTo(-310, 9);
		expect(
			emAtTemperature(
				{ emMv: -300, referenceTemperatureK: 298.15, reactionEntropyJPerMolK: 96.48533212, n: 1 },
				288.15
			)
		).toBeCloseTo(-310, 6);
	});
	it('rejects 0 K', () =>
		expect(() =>
			emAtTemperature({ emMv: 0, referenceTemperatureK: 298.15, slopeMvPerK: 1 }, 0)
		).toThrow(RangeError));
});
