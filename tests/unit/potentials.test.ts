import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	emAtPH,
	emAtTemperature,
	emSlopeMvPerPH,
	nernstFractionReduced,
	nernstSlopeMvPerDecade,
	slopeFromEntropy
} from '$lib/science';

describe('Nernst equation', () => {
	// 2.303RT/F = 59.16 mV at 25 °C: Bard & Faulkner, Electrochemical Methods, 2nd ed., §2.1 (from memory);
	// computed here from CODATA 2018 R and F.
	it('slope is 59.16 mV per decade at 298.15 K for n = 1', () =>
		expect(nernstSlopeMvPerDecade(1, 298.15)).toBeCloseTo(59.159, 3));
	it('slope halves for n = 2', () =>
		expect(nernstSlopeMvPerDecade(2, 298.15)).toBeCloseTo(29.58, 3));
	it('is half reduced at Em', () =>
		expect(nernstFractionReduced(-250, -250, 1, 298.15)).toBeCloseTo(0.5, 12));
	it('is 1/11 reduced one Nernst slope above Em (ox/red = 10)', () =>
		expect(nernstFractionReduced(-250 + 59.1596, -250, 1, 298.15)).toBeCloseTo(1 / 11, 5));
	it('stays within 0–1 without overflow far from Em', () => {
		expect(nernstFractionReduced(5000, 0)).toBeLessThan(1e-80);
		expect(nernstFractionReduced(50_000, 0)).toBe(0);
		expect(nernstFractionReduced(-5000, 0)).toBe(1);
	});
	it('rejects n = 0 and T = 0', () => {
		expect(() => nernstFractionReduced(0, 0, 0)).toThrow(RangeError);
		expect(() => nernstFractionReduced(0, 0, 1, 0)).toThrow(RangeError);
	});
	it('is monotonic in potential', () => {
		fc.assert(
			fc.property(
				fc.double({ min: -800, max: 800, noNaN: true }),
				fc.double({ min: 0.1, max: 100, noNaN: true }),
				(e, d) =>
					expect(nernstFractionReduced(e + d, 0)).toBeLessThanOrEqual(nernstFractionReduced(e, 0))
			)
		);
	});
});

describe('Nernst–Clark pH dependence (one proton on reduction)', () => {
	const coupling = { emAlkalineMv: -100, pKaOx: 6, pKaRed: 9 };
	// Clark (1960); Dutton, Methods Enzymol. 54, 411 (1978): −59 mV/pH between pKa,ox and pKa,red, flat outside.
	it('falls by 59.16 mV per pH unit between the two pKa values', () =>
		expect(emSlopeMvPerPH({ emAlkalineMv: 0, pKaRed: 12, pKaOx: 1 }, 6.5)).toBeCloseTo(-59.159, 2));
	it('is flat well above pKa,red', () => expect(emAtPH(coupling, 13)).toBeCloseTo(-100, 2));
	it('is flat well below pKa,ox at Em,alk + 59.16·(pKa,red − pKa,ox)', () =>
		expect(emAtPH(coupling, 1)).toBeCloseTo(-100 + 59.159 * 3, 1));
	it('is log10(2)·59.16 mV above Em,alk at pH = pKa,red', () =>
		expect(emAtPH({ emAlkalineMv: 0, pKaRed: 8 }, 8)).toBeCloseTo(59.159 * Math.log10(2), 3));
	it('slope is the derivative of Em', () => {
		const h = 1e-5;
		const numeric = (emAtPH(coupling, 7.3 + h) - emAtPH(coupling, 7.3 - h)) / (2 * h);
		expect(emSlopeMvPerPH(coupling, 7.3)).toBeCloseTo(numeric, 4);
	});
	it('rejects a pH outside −2…16', () => expect(() => emAtPH(coupling, 20)).toThrow(RangeError));
});

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
