import { describe, expect, it } from 'vitest';
import { parseTwoColumnText } from '$lib/server/calc/twoColumnText';

// Expected values are the numbers as written in each text (worked by hand).
const read = (text: string) => parseTwoColumnText(text, ['potential', 'signal'], 1000);

describe('parseTwoColumnText', () => {
	it.each([
		['commas', 'potential_mv,signal\n-400,0.98\n-350,0.5'],
		['commas and spaces', '-400, 0.98\n-350, 0.5'],
		['semicolons and decimal commas', 'E;signal\n−400;0,98\n−350;0,5'],
		['tabs', 'E\tsignal\n-400\t0.98\n-350\t0,5'],
		['spaces', 'E (mV)   signal\n  -400   0.98\n-350 0.5  '],
		['spaces and decimal commas', '−400 0,98\n−350 0,5'],
		['spaces, CRLF line ends', '-400 0.98\r\n-350 0.5\r\n']
	])('reads columns separated by %s', (_, text) => {
		expect(read(text)).toEqual({
			rows: [
				[-400, 0.98],
				[-350, 0.5]
			],
			errors: []
		});
	});

	it('reads a signal written with a decimal comma and three decimals (0,980 is not 980)', () =>
		expect(read('−400;0,980\n−350;0,125').rows).toEqual([
			[-400, 0.98],
			[-350, 0.125]
		]));

	it('reads numbers with the one decimal reader: hexadecimal and Infinity are not numbers', () =>
		expect(read('0x10 0.5\n-300 Infinity\n-200 0.1').errors).toEqual([
			'row 1, potential: "0x10" is not a number',
			'row 2, signal: "Infinity" is not a number'
		]));

	it('lists one error for every bad row, with its number and column', () => {
		const text = ['E,signal', '-400,1', '-350,abc', '-300', 'x,0.5', '-200,0'].join('\n');
		expect(read(text)).toEqual({
			rows: [
				[-400, 1],
				[-200, 0]
			],
			errors: [
				'row 3, signal: "abc" is not a number',
				'row 4: expected two columns (potential, signal), found 1',
				'row 5, potential: "x" is not a number'
			]
		});
	});

	it('does not read a comma-separated line with spaces as space-separated', () =>
		expect(read('-400, 0.98\n-350 ,0.5').rows).toEqual([
			[-400, 0.98],
			[-350, 0.5]
		]));
});
