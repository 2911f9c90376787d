import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import {
	LIST_KEYS,
	distanceApiQuerySchema,
	potentialApiQuery,
	spinRecordApiQuerySchema
} from '$lib/schemas/catalogueQuery';
import { NOT_A_DECIMAL } from '$lib/schemas/decimal';
import { parseSearchParams, queryInteger, queryNumber } from '$lib/schemas/searchParams';

/*
 * Query numbers are read by readDecimal (decimal.ts), not by Number() (zod's coercion), which
 * reads "0x10" as 16, "" as 0 and "Infinity" as a number. Every route whose query schema uses
 * queryNumber or queryInteger is exercised here through the schema it parses with.
 */

const distance = queryNumber(3.6, 100, ' Å');
const limit = queryInteger(1, 500);

describe('queryNumber', () => {
	it.each([
		['10', 10],
		['\u22120.5', -0.5], // Unicode minus
		['10,5', 10.5], // decimal comma
		['1e1', 10],
		[' 12.5 ', 12.5]
	])('reads %j as %d', (text, value) => {
		const wide = queryNumber(-100, 100);
		expect(wide.parse(text)).toBe(value);
	});

	// Each of these was a number to z.coerce.number: 0x10 → 16, '' → 0, Infinity → Infinity
	// (refused only by its bound), 1e400 → Infinity.
	it.each(['0x10', '', 'Infinity', '1e400', '0b11', '12 Å'])(
		'refuses %j as not a decimal',
		(text) => {
			const r = distance.safeParse(text);
			expect(r.success).toBe(false);
			expect(r.error?.issues[0]?.message).toBe(`${NOT_A_DECIMAL}, from 3.6 Å to 100 Å`);
		}
	);

	it('names its bounds, and the reason for them when one is given', () => {
		expect(distance.safeParse('3.5').error?.issues[0]?.message).toBe(
			'expected a number from 3.6 Å to 100 Å'
		);
		const reasoned = queryNumber(3.6, 100, ' Å', 'van der Waals contact');
		expect(reasoned.safeParse('0').error?.issues[0]?.message).toBe(
			'expected a number from 3.6 Å to 100 Å (van der Waals contact)'
		);
	});

	it('passes numbers through unchanged (schemas parsed from objects, as the OpenAPI examples)', () =>
		expect(distance.parse(9.4)).toBe(9.4));

	it('keeps default and optional working around the reading step', () => {
		const schema = z.object({ t: queryNumber(1, 1000).default(298.15), h: distance.optional() });
		expect(schema.parse({})).toEqual({ t: 298.15 });
		expect(schema.parse({ t: '300,5', h: '4' })).toEqual({ t: 300.5, h: 4 });
	});
});

describe('queryInteger', () => {
	it('reads whole numbers and refuses hexadecimal, fractions and Infinity', () => {
		expect(limit.parse('50')).toBe(50);
		expect(limit.parse('1e2')).toBe(100);
		// Number('0x10') is 16, within the bounds: once accepted as limit=16.
		for (const text of ['0x10', '2,5', 'Infinity', '1e400', ''])
			expect(limit.safeParse(text).success, text).toBe(false);
	});
});

describe('routes that read query numbers', () => {
	const api = (schema: z.ZodObject, qs: string) =>
		parseSearchParams(schema, new URLSearchParams(qs), LIST_KEYS);

	it('potentials: emMin/emMax/phMin/tMin read the typeset minus and decimal comma', () => {
		const r = api(potentialApiQuery, 'emMin=\u2212400&emMax=\u2212100,5&phMin=7,0&tMax=300');
		expect(r.ok && [r.data.emMin, r.data.emMax, r.data.phMin, r.data.tMax]).toEqual([
			-400, -100.5, 7, 300
		]);
	});
	it('potentials: hexadecimal and Infinity are named errors, limit too', () => {
		const r = api(potentialApiQuery, 'emMin=0x10&emMax=Infinity&limit=0x10');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(Object.keys(r.fields).sort()).toEqual(['emMax', 'emMin', 'limit']);
	});
	it('distances and spin records: the same reader', () => {
		const d = api(distanceApiQuerySchema, 'edgeMin=4,5&edgeMax=0x10');
		expect(!d.ok && Object.keys(d.fields)).toEqual(['edgeMax']);
		const s = api(spinRecordApiQuerySchema, 'spin=1,5');
		expect(s.ok && s.data.spin).toBe(1.5);
	});
});
