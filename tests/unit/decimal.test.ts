import { describe, expect, it } from 'vitest';
import { readDecimal } from '$lib/schemas/decimal';

describe('readDecimal', () => {
	it.each([
		['-0.42', -0.42],
		['\u22120.42', -0.42], // Unicode minus, as pasted from typeset papers
		['\u20120.42', -0.42],
		['  12.5  ', 12.5],
		['12,5', 12.5],
		['\u22120,25', -0.25],
		['0,980', 0.98], // a leading zero is no digit group: not ambiguous
		['\u22120,125', -0.125],
		['1 000', 1000],
		['1\u2009000.5', 1000.5],
		['+3', 3],
		['.5', 0.5],
		['5.', 5],
		['1e-3', 0.001],
		['6.02E23', 6.02e23]
	])('reads %j as %d', (text, value) => {
		expect(readDecimal(text)).toBe(value);
	});

	it.each([
		'',
		'  ',
		'0x10',
		'0b11',
		'0o7',
		'Infinity',
		'-Infinity',
		'NaN',
		'1,000',
		'1,2,3',
		'1.2.3',
		'12 mV',
		'e5',
		'--1',
		'1e400'
	])('refuses %j', (text) => {
		expect(readDecimal(text)).toBeNull();
	});

	it('reads a comma as a separator only when asked', () => {
		expect(readDecimal('12,5', { decimalComma: false })).toBeNull();
	});
});
