import { describe, expect, it } from 'vitest';
import { apiNumberText, curlPost, hopRateApiUrl } from '$lib/calcApi';
import { formatNumber, formatPowerOfTen, formatSignificant, typesetNumbersIn } from '$lib/format';
import { hopPickSchema, titrationRequestSchema, tunnellingRequestSchema } from '$lib/schemas/calc';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { TITRATION_DEFAULTS, titrationRequestOf } from '../../src/routes/calc/titration/fields';
import { DEFAULTS, tunnellingRequestOf } from '../../src/routes/calc/tunnelling/fields';

/*
 * The calculators' forms: what they read from typed text, the API request they show, and how
 * their numbers are typeset. Expected values are the numbers typed, worked by hand.
 */

describe('the hop-rate API line', () => {
	it('carries the fields as they stand, read as the API reads them', () => {
		const url = hopRateApiUrl('http://127.0.0.1:1', {
			distance: ' 11,5 ',
			dG: '\u22120,2',
			lambda: '0.7',
			temperature: '',
			packing: undefined,
			protein: 'Rox'
		});
		expect(url).toBe(
			'http://127.0.0.1:1/api/v1/calc/hop-rate?distance=11.5&dG=-0.2&lambda=0.7&model=moser-dutton'
		);
	});
	it('passes text that is not a number as typed, for the API to refuse by name', () =>
		expect(apiNumberText('0x10')).toBe('0x10'));
});

describe('the curl line', () => {
	it('is a POST of the JSON body, quoted for a shell', () =>
		expect(curlPost('http://h', '/api/v1/calc/titration', { a: "it's" })).toBe(
			`curl -X POST 'http://h/api/v1/calc/titration' -H 'Content-Type: application/json' -d '{"a":"it'\\''s"}'`
		));
});

describe('titration fields', () => {
	const text = 'E signal\n\u2212400 0,98\n\u2212350 0,5\n\u2212300 0,2\n\u2212250 0,02';
	it('read space-separated columns, a Unicode minus and decimal commas into the API request', () => {
		const { body, problems, errors } = titrationRequestOf({
			...TITRATION_DEFAULTS,
			points: text,
			n: ' 1 ',
			temperatureK: '298,15'
		});
		expect(problems).toEqual([]);
		expect(errors).toEqual({});
		expect(body).toEqual({
			points: [
				{ potentialMv: -400, signal: 0.98 },
				{ potentialMv: -350, signal: 0.5 },
				{ potentialMv: -300, signal: 0.2 },
				{ potentialMv: -250, signal: 0.02 }
			],
			components: 1,
			n: 1,
			temperatureK: 298.15
		});
		expect(titrationRequestSchema.safeParse(body).success).toBe(true);
	});
	it('leave n out when it is empty, so that the fit is asked for n (and only then)', () => {
		expect(
			titrationRequestOf({ ...TITRATION_DEFAULTS, points: text, n: '' }).body
		).not.toHaveProperty('n');
		expect(titrationRequestOf({ ...TITRATION_DEFAULTS, points: text, n: '2' }).body.n).toBe(2);
	});
	it('name a bad n or temperature beside its field', () =>
		expect(
			Object.keys(
				titrationRequestOf({ points: text, components: '1', n: 'one', temperatureK: '0x1' }).errors
			).sort()
		).toEqual(['n', 'temperatureK']));
});

describe('tunnelling fields', () => {
	it('read every energy in the page unit with a Unicode minus and decimal commas', () => {
		const { body, errors } = tunnellingRequestOf({
			...DEFAULTS,
			energyUnit: 'kJ/mol',
			wellBarrier: '20,92',
			asymmetry: '\u22120,4184',
			barrier: ' 41,84 ',
			levels: '3'
		});
		expect(errors).toEqual({});
		// 20.92 kJ/mol = 5 kcal/mol; 0.4184 kJ/mol = 0.1 kcal/mol (thermochemical calorie, 4.184 J).
		expect(body.potential).toMatchObject({ kind: 'double-well', halfSeparationA: 0.35 });
		const potential = body.potential as { barrierKcalMol: number; asymmetryKcalMol: number };
		expect(potential.barrierKcalMol).toBeCloseTo(5, 12);
		expect(potential.asymmetryKcalMol).toBeCloseTo(-0.1, 12);
		expect(body.barrierKJmol).toBeCloseTo(41.84, 12);
		expect(body.levels).toBe(3);
		expect(tunnellingRequestSchema.safeParse(body).success).toBe(true);
	});
	it('leave out what was not entered, as a script would', () =>
		expect(Object.keys(tunnellingRequestOf(DEFAULTS).body)).not.toContain('barrierKJmol'));
	it('read pasted points by line, and list the bad ones', () => {
		const out = tunnellingRequestOf({
			...DEFAULTS,
			potentialKind: 'points',
			pointsText: 'x V\n\u22120,5 2\n0 oops\n0,5 2'
		});
		expect(out.lines).toEqual([2, 4]);
		expect(out.problems.map((p) => p.row)).toEqual([3]);
	});
});

describe('numbers as the calculator pages show them', () => {
	it('use a true minus sign and powers of ten', () => {
		expect(formatPowerOfTen(41_400_000)).toBe('4.14 × 10⁷');
		expect(formatPowerOfTen(0.000285)).toBe('2.85 × 10⁻⁴');
		expect(formatSignificant(-0.5)).toBe('−0.5');
		expect(formatNumber(-0.09)).toBe('−0.09');
	});
	it('typeset the numbers inside a note, leaving words alone', () =>
		expect(typesetNumbersIn('Grid -1.033 to 1.034 Å: decayed to 5.8e-9 (well-known, x=-2)')).toBe(
			'Grid −1.033 to 1.034 Å: decayed to 5.8 × 10⁻⁹ (well-known, x=−2)'
		));
});

describe('the hop-rate choice of two centres', () => {
	it('takes centre accessions, and refuses anything else by name', () => {
		const ok = parseSearchParams(
			hopPickSchema,
			new URLSearchParams('donor=HL000008&acceptor=HL000010&ph=7,5')
		);
		expect(ok).toEqual({ ok: true, data: { donor: 'HL000008', acceptor: 'HL000010', ph: 7.5 } });
		const bad = parseSearchParams(hopPickSchema, new URLSearchParams('donor=8&ph=15'));
		expect(bad.ok).toBe(false);
		if (!bad.ok) expect(Object.keys(bad.fields).sort()).toEqual(['donor', 'ph']);
	});
});
