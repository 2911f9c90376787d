import { describe, expect, it } from 'vitest';
import { formatOrderOfMagnitude, formatSignificant } from '$lib/format';
import {
	DEFAULTS,
	convertFormEnergies,
	formatEnergy
} from '../../src/routes/calc/tunnelling/fields';

// The tunnelling page's unit switch and number formatting (src/routes/calc/tunnelling/fields.ts).
describe('the tunnelling form’s unit switch', () => {
	// 1 kcal/mol = 4.184 kJ/mol exactly (thermochemical calorie).
	it('converts every energy field and the pasted points’ V column, nothing else', () => {
		const values = {
			...DEFAULTS,
			barrier: '10',
			wellBarrier: '6',
			asymmetry: '−0,5',
			halfSeparationA: '0.35',
			temperatureK: '300',
			pointsText: 'x,V\n-0.5, 2\n0,1.5\n0.5,abc'
		};
		const next = convertFormEnergies(values, 'kcal/mol', 'kJ/mol');
		expect(next).toMatchObject({
			energyUnit: 'kJ/mol',
			barrier: '41.84',
			wellBarrier: '25.104',
			asymmetry: '-2.092',
			halfSeparationA: '0.35',
			temperatureK: '300'
		});
		expect(next.pointsText).toBe('x,V\n-0.5, 8.368\n0,6.276\n0.5,abc');
		expect(convertFormEnergies(next, 'kJ/mol', 'kcal/mol').wellBarrier).toBe('6');
	});
	it('reads the points with the separator the server reads them with', () => {
		// The same texts parseTwoColumnText reads (schemas/twoColumnText.ts): one separator for
		// the whole text, a decimal comma wherever commas do not separate the columns.
		const convert = (pointsText: string) =>
			convertFormEnergies({ ...DEFAULTS, pointsText }, 'kcal/mol', 'kJ/mol').pointsText;
		expect(convert('-0.5 2\n0  1,5')).toBe('-0.5 8.368\n0  6.276');
		expect(convert('-0.5;2\n0; 1,5')).toBe('-0.5;8.368\n0; 6.276');
		expect(convert('-0.5\t2\n0\t1.5')).toBe('-0.5\t8.368\n0\t6.276');
		// A tab anywhere makes tabs the separator: a comma line is then one cell, left as typed.
		expect(convert('-0.5\t2\n0,1.5')).toBe('-0.5\t8.368\n0,1.5');
	});
	it('leaves what is not a number as typed, for the action to report', () => {
		expect(convertFormEnergies({ ...DEFAULTS, barrier: '0x10' }, 'kcal/mol', 'cm-1').barrier).toBe(
			'0x10'
		);
	});
});

describe('numbers on the tunnelling page', () => {
	it('an order of magnitude has one significant figure', () => {
		expect(formatOrderOfMagnitude(8228.4)).toBe('≈ 8 × 10³');
		expect(formatOrderOfMagnitude(87.7)).toBe('≈ 9 × 10¹');
		expect(formatOrderOfMagnitude(1.64)).toBe('≈ 2');
	});
	it('small and large numbers in powers of ten, with a true minus sign', () => {
		expect(formatSignificant(1.2345e-5, 3)).toBe('1.23 × 10⁻⁵');
		expect(formatSignificant(-0.5)).toBe('−0.5');
		expect(formatEnergy(1, 'kJ/mol')).toBe('4.184\u00a0kJ/mol');
		expect(formatEnergy(1, 'cm-1', 6)).toBe('349.755\u00a0cm⁻¹');
	});
});
