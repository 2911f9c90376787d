import { describe, expect, it } from 'vitest';
import {
	accessionNumber,
	formatAccession,
	isAccession,
	parseVersionSegment,
	permalinkPath
} from '$lib/schemas/accession';

describe('accessions', () => {
	it('formats HL plus six digits', () => expect(formatAccession(123)).toBe('HL000123'));
	it('widens past six digits instead of running out', () => {
		expect(formatAccession(999_999)).toBe('HL999999');
		expect(formatAccession(1_000_000)).toBe('HL1000000');
		expect(formatAccession(123_456_789)).toBe('HL123456789');
		expect(isAccession(formatAccession(1_000_000))).toBe(true);
		expect(accessionNumber('HL1000000')).toBe(1_000_000);
	});
	it('refuses 0, fractions and numbers beyond twelve digits', () => {
		expect(() => formatAccession(0)).toThrow(RangeError);
		expect(() => formatAccession(1.5)).toThrow(RangeError);
		expect(() => formatAccession(1_000_000_000_000)).toThrow(RangeError);
	});
	it('recognises only the exact form (one spelling per number)', () => {
		expect(isAccession('HL000001')).toBe(true);
		expect(isAccession('HL1000000')).toBe(true);
		for (const bad of [
			'HL1',
			'hl000001',
			'HL0000001',
			'HL0100000',
			'HL00000A',
			' HL000001',
			'HL1234567890123'
		])
			expect(isAccession(bad)).toBe(false);
	});
	it('reads the number back', () => expect(accessionNumber('HL000042')).toBe(42));
	it('reads a version segment of a permalink', () => {
		expect(parseVersionSegment('v7')).toBe(7);
		expect(parseVersionSegment('v0')).toBeNull();
	});
	it('builds permalinks', () => {
		expect(permalinkPath('HL000123')).toBe('/e/HL000123');
		expect(permalinkPath('HL000123', 2)).toBe('/e/HL000123/v2');
	});
});
