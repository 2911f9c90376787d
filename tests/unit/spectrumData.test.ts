import { describe, expect, it } from 'vitest';
import {
	SPECTRUM_MAX_BYTES,
	SPECTRUM_MAX_POINTS,
	fieldUnitOf,
	potentialUnitOf,
	readColumnHeader,
	readSpectrumData
} from '$lib/schemas/spectrumData';

const ok = (text: string | Uint8Array, xAxis?: 'field' | 'potential') => {
	const r = readSpectrumData(text, { xAxis });
	if (!r.ok) throw new Error(`expected a reading, got ${r.problems.join(' | ')}`);
	return r.data;
};
const problems = (text: string | Uint8Array, xAxis?: 'field' | 'potential') => {
	const r = readSpectrumData(text, { xAxis });
	if (r.ok) throw new Error('expected problems');
	return r.problems;
};

describe('column headers', () => {
	it('name (unit)', () =>
		expect(readColumnHeader('Field (mT)')).toEqual({ name: 'Field', unit: 'mT' }));
	it('name [unit]', () =>
		expect(readColumnHeader(' Current [nA] ')).toEqual({ name: 'Current', unit: 'nA' }));
	it('name / unit', () => expect(readColumnHeader('E / V')).toEqual({ name: 'E', unit: 'V' }));
	it('a name alone', () =>
		expect(readColumnHeader('Intensity')).toEqual({ name: 'Intensity', unit: null }));
	it('quoted', () => expect(readColumnHeader('"B (G)"')).toEqual({ name: 'B', unit: 'G' }));
	it('a unit with a slash inside brackets', () =>
		expect(readColumnHeader('dχ″/dB (a.u.)')).toEqual({ name: 'dχ″/dB', unit: 'a.u.' }));
	it('field units', () => {
		expect(fieldUnitOf('mT')).toBe('mT');
		expect(fieldUnitOf('Gauss')).toBe('G');
		expect(fieldUnitOf('T')).toBe('T');
		expect(fieldUnitOf('nA')).toBeNull();
		expect(fieldUnitOf(null)).toBeNull();
	});
	it('potential units', () => {
		expect(potentialUnitOf('V')).toBe('V');
		expect(potentialUnitOf('mV')).toBe('mV');
		expect(potentialUnitOf('mT')).toBeNull();
	});
});

describe('reading a spectrum file', () => {
	it('comma separated with a header', () => {
		const d = ok('Field (mT),Intensity (a.u.)\n330.0,0.1\n330.5,-0.2\n', 'field');
		expect(d.x).toEqual({ name: 'Field', unit: 'mT' });
		expect(d.y).toEqual({ name: 'Intensity', unit: 'a.u.' });
		expect(d.points).toEqual([
			[330, 0.1],
			[330.5, -0.2]
		]);
	});
	it('tab separated, CRLF, decimal commas, Unicode minus', () => {
		const d = ok('Potential (V)\tCurrent (nA)\r\n−0,600\t1,5\r\n−0,590\t2,0\r\n', 'potential');
		expect(d.x.unit).toBe('V');
		expect(d.points).toEqual([
			[-0.6, 1.5],
			[-0.59, 2]
		]);
	});
	it('space separated with spaces inside the header cells', () => {
		const d = ok('Field (G) Signal (a.u.)\n3300 0.1\n3305 0.2\n', 'field');
		expect(d.x).toEqual({ name: 'Field', unit: 'G' });
		expect(d.y).toEqual({ name: 'Signal', unit: 'a.u.' });
	});
	it('no header: columns named x and y, no units', () => {
		const d = ok('1 2\n3 4\n');
		expect(d.x).toEqual({ name: 'x', unit: null });
		expect(d.points).toHaveLength(2);
	});
	it('a cyclic sweep keeps its order (out and back)', () =>
		expect(ok('E (mV);i (nA)\n0;1\n100;2\n0;-1\n').points.map((p) => p[0])).toEqual([0, 100, 0]));
	it('reads UTF-8 bytes with a byte-order mark', () => {
		const bytes = new TextEncoder().encode('\uFEFFB (mT),I\n1,2\n3,4\n');
		expect(ok(bytes, 'field').x).toEqual({ name: 'B', unit: 'mT' });
	});
});

describe('problems', () => {
	it('bad rows are listed with their line numbers, like the calculators', () => {
		const p = problems('Field (mT),I\n330,1\n331,abc\n\n332\n333,4\n');
		expect(p).toEqual([
			'row 3: y “abc” is not a number; expected a decimal number such as −400 or 0,98',
			'row 5: found 1 column; expected two (x, y)'
		]);
	});
	it('an EPR file without a field unit is refused, not guessed', () =>
		expect(problems('Field,I\n330,1\n331,2\n', 'field')).toEqual([
			'the x column must say its unit: expected a field in mT, G, T (e.g. a header "Field (mT)")'
		]));
	it('a voltammogram with a field unit is refused', () =>
		expect(problems('B (mT),I (nA)\n1,1\n2,2\n', 'potential')[0]).toMatch(
			/unit “mT” is not one the plot can convert; expected a potential in mV or V/
		));
	it('a header that names one column', () =>
		expect(problems('Field and intensity\n1 2\n3 4\n')[0]).toMatch(
			/^row 1: the header does not name two columns/
		));
	it('too long a header name', () =>
		expect(problems(`${'n'.repeat(61)} (mT),I\n1,2\n3,4\n`)[0]).toMatch(
			/longer than 60 characters/
		));
	it('fewer than two points', () =>
		expect(problems('x,y\n1,2\n')).toEqual(['at least 2 points are needed; the file has 1']));
	it('an empty file', () =>
		expect(problems('')).toEqual(['at least 2 points are needed; the file has 0']));
	it('every x the same', () =>
		expect(problems('1,2\n1,3\n')).toEqual([
			'every x value is the same; expected x to change from row to row'
		]));
	it('more points than allowed', () => {
		const rows = Array.from({ length: SPECTRUM_MAX_POINTS + 1 }, (_, i) => `${i},1`).join('\n');
		expect(problems(rows)).toContain(`at most ${SPECTRUM_MAX_POINTS} points; the text has more`);
	});
	it('a file over the byte limit is refused before it is read', () =>
		expect(problems(new Uint8Array(SPECTRUM_MAX_BYTES + 1))).toEqual([
			`the file is larger than ${SPECTRUM_MAX_BYTES} bytes`
		]));
	it('bytes that are not UTF-8', () =>
		expect(problems(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0xff, 0xfe]))[0]).toMatch(/not UTF-8/));
	it('binary with NUL bytes', () => expect(problems('1,2\0\n3,4')[0]).toMatch(/not text/));
	it('a long listing of bad rows is capped', () => {
		const rows = ['x,y', ...Array.from({ length: 50 }, () => 'a,b')].join('\n');
		const p = problems(rows);
		expect(p.at(-1)).toBe('and 30 more rows with problems');
	});
});
