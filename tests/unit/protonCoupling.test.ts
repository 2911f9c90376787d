import { describe, expect, it } from 'vitest';
import { emAtPH, emSlopeMvPerPH } from '$lib/science';

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
