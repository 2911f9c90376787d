import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareCodePoints } from '$lib/server/search/potentialIndex';

// The oracle: SQLite's BINARY collation compares UTF-8 bytes (sqlite.org/datatype3.html,
// "Collating Sequences"), which Buffer.compare does on the encoded strings.
const utf8Order = (a: string, b: string) =>
	Math.sign(Buffer.compare(Buffer.from(a, 'utf8'), Buffer.from(b, 'utf8')));

describe('compareCodePoints', () => {
	it('orders text as SQLite orders UTF-8, not as UTF-16 units', () => {
		expect(compareCodePoints('\uff46', '\u{1d523}')).toBeLessThan(0);
		expect('\uff46' < '\u{1d523}').toBe(false);
		fc.assert(
			fc.property(fc.string({ unit: 'grapheme' }), fc.string({ unit: 'grapheme' }), (a, b) => {
				expect(Math.sign(compareCodePoints(a, b))).toBe(utf8Order(a, b));
			}),
			{ numRuns: 2000 }
		);
	});
});
