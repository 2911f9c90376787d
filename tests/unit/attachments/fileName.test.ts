import { describe, expect, it } from 'vitest';
import { cleanFileName, FILE_NAME_MAX } from '$lib/schemas/attachment';

// Oracle: the Unicode character database's categories for each code point used (U+202E RIGHT-TO-
// LEFT OVERRIDE is Cf, U+200B ZERO WIDTH SPACE is Cf, U+0085 NEXT LINE is Cc, U+3164 HANGUL
// FILLER is default-ignorable, U+00A0 is Zs), and counting code points with the spread operator.

const codePoints = (s: string) => [...s].length;
const wellFormed = (s: string) => !/\p{Cs}/u.test(s);

describe('cleanFileName', () => {
	it('keeps an ordinary name as it is', () => {
		expect(cleanFileName('EPR spectrum, 10 K.png')).toBe('EPR spectrum, 10 K.png');
		expect(cleanFileName('Spektrum Ä–ö µ.csv')).toBe('Spektrum Ä–ö µ.csv');
	});

	it('keeps only the last path segment', () => {
		expect(cleanFileName('C:\\Users\\me\\plot.png')).toBe('plot.png');
		expect(cleanFileName('../../etc/passwd')).toBe('passwd');
	});

	it('removes a right-to-left override that would show "…gnp.exe" as "…exe.png"', () => {
		expect(cleanFileName('spectrum\u202Egnp.exe')).toBe('spectrumgnp.exe');
		expect(cleanFileName('a\u2066b\u2069c\u200F.txt')).toBe('abc.txt'); // isolates, RLM
	});

	it('removes zero-width and other invisible code points', () => {
		expect(cleanFileName('pl\u200Bot\u200D\u2060\uFEFF.png')).toBe('plot.png');
		expect(cleanFileName('\u3164\u00AD.png')).toBe('.png');
		expect(cleanFileName('\u3164\u00AD')).toBe('attachment');
		expect(cleanFileName('tag\u{E0041}\u{E0042}.png')).toBe('tag.png'); // tag characters
	});

	it('removes C0 and C1 controls, DEL, line separators and quotes', () => {
		expect(cleanFileName('a\u0000b\u0007c\u007Fd\u0085e\u009Bf\u2028g\u2029"h".txt')).toBe(
			'abcdefgh.txt'
		);
	});

	it('makes other spaces plain and runs of them one, so padding cannot push the extension away', () => {
		expect(cleanFileName('photo.png\u00A0\u3000\u2003     .exe')).toBe('photo.png .exe');
		expect(cleanFileName('  plot   1 .png  ')).toBe('plot 1 .png');
	});

	it('removes lone surrogates and keeps pairs', () => {
		expect(cleanFileName('a\uD800b\uDC00c.png')).toBe('abc.png');
		expect(cleanFileName('🧪 run.png')).toBe('🧪 run.png');
	});

	it('drops trailing dots and spaces, which some systems strip to show another extension', () => {
		expect(cleanFileName('plot.png. . .')).toBe('plot.png');
	});

	it('composes to NFC', () => {
		expect(cleanFileName('Mo\u0308ssbauer.png')).toBe('Mössbauer.png');
	});

	it('never returns an empty, dot or dot-dot name', () => {
		for (const name of ['', '   ', '.', '..', '\u202E', '/', 'a/']) {
			expect(cleanFileName(name)).toBe('attachment');
		}
	});

	it('cuts a long name by code points, keeps its extension and never splits a surrogate pair', () => {
		// 130 astral characters: 260 UTF-16 units, 130 code points.
		const name = `${'😀'.repeat(130)}.png`;
		const clean = cleanFileName(name);
		expect(codePoints(clean)).toBe(FILE_NAME_MAX);
		expect(clean.endsWith('….png')).toBe(true);
		expect(wellFormed(clean)).toBe(true);
		expect(clean.startsWith('😀'.repeat(FILE_NAME_MAX - 5))).toBe(true);
	});

	it('a name of exactly the limit is kept whole', () => {
		const name = `${'x'.repeat(FILE_NAME_MAX - 4)}.csv`;
		expect(cleanFileName(name)).toBe(name);
		expect(cleanFileName(`y${name}`)).toBe(`${'y'.repeat(1)}${'x'.repeat(FILE_NAME_MAX - 6)}….csv`);
	});

	it('cuts between graphemes, not between a letter and its combining mark', () => {
		// "e" + two combining marks that have no precomposed form: 3 code points each.
		const clean = cleanFileName(`${'e\u0301\u0323'.repeat(60)}.txt`);
		expect(codePoints(clean)).toBeLessThanOrEqual(FILE_NAME_MAX);
		const stem = clean.slice(0, clean.indexOf('…'));
		expect(stem.normalize('NFD').length % 3).toBe(0);
		expect(clean.endsWith('….txt')).toBe(true);
	});

	it('a long name without an extension is cut to the limit with the mark at the end', () => {
		const clean = cleanFileName('z'.repeat(500));
		expect(codePoints(clean)).toBe(FILE_NAME_MAX);
		expect(clean.endsWith('z…')).toBe(true);
	});

	it('property: any string gives a well-formed visible name within the limit', () => {
		let seed = 7;
		const next = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff);
		for (let run = 0; run < 500; run++) {
			let name = '';
			const length = next() % 300;
			for (let i = 0; i < length; i++) {
				const pick = next() % 4;
				const cp =
					pick === 0
						? 0x20 + (next() % 0x5f)
						: pick === 1
							? next() % 0x3000
							: pick === 2
								? 0xd800 + (next() % 0x800) // lone surrogates among the rest
								: 0x1f000 + (next() % 0x1000);
				name += cp >= 0xd800 && cp < 0xe000 ? String.fromCharCode(cp) : String.fromCodePoint(cp);
			}
			const clean = cleanFileName(name);
			expect(clean.length).toBeGreaterThan(0);
			expect(codePoints(clean)).toBeLessThanOrEqual(FILE_NAME_MAX);
			expect(wellFormed(clean)).toBe(true);
			expect(/[\p{Cc}\p{Cf}"]/u.test(clean)).toBe(false);
			expect(cleanFileName(clean)).toBe(clean); // cleaning twice changes nothing
		}
	});
});
