import { describe, expect, it } from 'vitest';
import {
	EXPECTED_NUMBER,
	ROW_PROBLEMS_SHOWN,
	listRowProblems,
	parseTwoColumnText
} from '$lib/schemas/twoColumnText';

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
		const out = read(text);
		expect(out.rows).toEqual([
			[-400, 0.98],
			[-350, 0.5]
		]);
		expect(out.problems).toEqual([]);
	});

	it('reads a signal written with a decimal comma and three decimals (0,980 is not 980)', () =>
		expect(read('−400;0,980\n−350;0,125').rows).toEqual([
			[-400, 0.98],
			[-350, 0.125]
		]));

	it('reads numbers with the one decimal reader: hexadecimal and Infinity are not numbers', () =>
		expect(read('0x10 0.5\n-300 Infinity\n-200 0.1').problems).toEqual([
			{ row: 1, message: `potential “0x10” is not a number; ${EXPECTED_NUMBER}` },
			{ row: 2, message: `signal “Infinity” is not a number; ${EXPECTED_NUMBER}` }
		]));

	it('gives one message per bad row, saying what was wrong and what was expected', () => {
		const text = ['E,signal', '-400,1', '-350,abc', '-300', 'x,y', '-200,0'].join('\n');
		const out = read(text);
		expect(out.rows).toEqual([
			[-400, 1],
			[-200, 0]
		]);
		expect(listRowProblems(out.problems)).toEqual([
			`row 3: signal “abc” is not a number; ${EXPECTED_NUMBER}`,
			'row 4: found 1 column; expected two (potential, signal)',
			`row 5: potential “x” is not a number, signal “y” is not a number; ${EXPECTED_NUMBER}`
		]);
	});

	it('numbers rows as the lines of the text, blank lines included', () => {
		const out = read('E signal\n\n−400 1\n\n−300 oops\n−200 0');
		expect(out.lines).toEqual([3, 6]);
		expect(out.problems.map((p) => p.row)).toEqual([5]);
	});

	it('does not read a comma-separated line with spaces as space-separated', () =>
		expect(read('-400, 0.98\n-350 ,0.5').rows).toEqual([
			[-400, 0.98],
			[-350, 0.5]
		]));
});

describe('listRowProblems', () => {
	it('lists the first rows and says how many more, not hundreds of lines', () => {
		// 50 rows of volts pasted where one column was expected: every row has three cells.
		const text = Array.from({ length: 50 }, (_, i) => `-0.${i} 0.5 0.1`).join('\n');
		const list = listRowProblems(read(text).problems);
		expect(list).toHaveLength(ROW_PROBLEMS_SHOWN + 1);
		expect(list[0]).toBe('row 1: found 3 columns; expected two (potential, signal)');
		expect(list.at(-1)).toBe(`and ${50 - ROW_PROBLEMS_SHOWN} more rows with problems`);
	});

	it('joins several problems of one row and orders rows by number', () =>
		expect(
			listRowProblems([
				{ row: 7, message: 'b' },
				{ row: 2, message: 'a' },
				{ row: 7, message: 'c' }
			])
		).toEqual(['row 2: a', 'row 7: b; c']));
});
