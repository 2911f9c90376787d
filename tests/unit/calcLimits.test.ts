import { describe, expect, it } from 'vitest';
import {
	MAX_GRID_POINTS,
	MAX_POTENTIAL_SAMPLES,
	MAX_TITRATION_POINTS,
	titrationRequestSchema,
	tunnellingRequestSchema
} from '$lib/schemas/calc';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { AddressWindow, addressKey } from '$lib/server/calc/addressLimit';
import { CalcTimeLimitError } from '$lib/server/calc/errors';
import { parseTwoColumnText } from '$lib/schemas/twoColumnText';

describe('addressKey', () => {
	it('keeps IPv4 addresses whole, also when written IPv4-mapped', () => {
		expect(addressKey('192.0.2.7')).toBe('192.0.2.7');
		expect(addressKey('::ffff:192.0.2.7')).toBe('192.0.2.7');
	});
	it('counts IPv6 addresses by their /64, however they are written', () => {
		const a = addressKey('2001:db8:0:1::17');
		expect(a).toBe('2001:db8:0:1::/64');
		expect(addressKey('2001:0DB8:0000:0001:ffff:0:0:9')).toBe(a);
		expect(addressKey('2001:db8:0:1:a:b:c:d%eth0')).toBe(a);
		expect(addressKey('2001:db8:0:2::17')).not.toBe(a);
		expect(addressKey('::1')).toBe('0:0:0:0::/64');
	});
});

describe('AddressWindow (sliding window per address)', () => {
	it('allows the limit, refuses the next one until the oldest leaves the window', () => {
		let now = 1_000_000;
		const w = new AddressWindow(3, 60_000, () => now);
		for (let i = 0; i < 3; i++) {
			expect(w.retryAfterMs('a')).toBe(0);
			w.record('a');
			now += 10_000;
		}
		// Calls at 0, 10 and 20 s; now 30 s: the first leaves the window at 60 s.
		expect(w.retryAfterMs('a')).toBe(30_000);
		expect(w.retryAfterMs('b')).toBe(0);
		now += 30_000;
		expect(w.retryAfterMs('a')).toBe(0);
	});
	it('remembers a bounded number of addresses, forgetting the least recent', () => {
		const now = 0;
		const w = new AddressWindow(1, 60_000, () => now, 3);
		for (const key of ['a', 'b', 'c', 'a', 'd']) w.record(key);
		expect(w.size).toBe(3);
		expect(w.retryAfterMs('b')).toBe(0); // forgotten
		expect(w.retryAfterMs('a')).toBeGreaterThan(0); // used again, so kept
	});
});

describe('input sizes in the calculator schemas', () => {
	const points = (n: number) =>
		Array.from({ length: n }, (_, i) => ({ potentialMv: i, signal: i % 2 }));
	it('titration: at most MAX_TITRATION_POINTS, and the message says so', () => {
		expect(titrationRequestSchema.safeParse({ points: points(MAX_TITRATION_POINTS) }).success).toBe(
			true
		);
		const parsed = titrationRequestSchema.safeParse({ points: points(MAX_TITRATION_POINTS + 1) });
		expect(parsed.success).toBe(false);
		expect(fieldErrors(parsed.error!).points).toEqual([
			`at most ${MAX_TITRATION_POINTS} points (a titration needs tens to a few hundred)`
		]);
	});
	it('tunnelling: grid points and sampled rows are bounded, each error under its field', () => {
		const well = { kind: 'double-well', barrierKcalMol: 8, halfSeparationA: 0.35 };
		expect(
			tunnellingRequestSchema.safeParse({ potential: well, points: MAX_GRID_POINTS }).success
		).toBe(true);
		const grid = tunnellingRequestSchema.safeParse({
			potential: well,
			points: MAX_GRID_POINTS + 1
		});
		expect(fieldErrors(grid.error!).points).toEqual([
			`expected a whole number of grid points from 50 to ${MAX_GRID_POINTS}`
		]);
		const rows = Array.from({ length: MAX_POTENTIAL_SAMPLES + 1 }, (_, i) => ({
			xA: i / 100,
			energyKcalMol: 0
		}));
		const sampled = tunnellingRequestSchema.safeParse({
			potential: { kind: 'points', points: rows }
		});
		expect(fieldErrors(sampled.error!)['potential.points']?.[0]).toContain(
			`at most ${MAX_POTENTIAL_SAMPLES} points`
		);
	});
});

describe('parseTwoColumnText limits', () => {
	it('accepts exactly maxRows rows after a header', () => {
		const text = ['E,signal', '1,2', '3,4', '5,6'].join('\n');
		expect(parseTwoColumnText(text, ['E', 'signal'], 3)).toEqual({
			rows: [
				[1, 2],
				[3, 4],
				[5, 6]
			],
			lines: [2, 3, 4],
			problems: [],
			tooMany: null
		});
	});
	it('stops reading one row past the limit and says so', () => {
		const text = Array.from({ length: 100_000 }, (_, i) => `${i},${i}`).join('\n');
		const { rows, problems, tooMany } = parseTwoColumnText(text, ['E', 'signal'], 3);
		expect(rows.length).toBeLessThanOrEqual(5);
		expect(problems).toEqual([]);
		expect(tooMany).toBe('at most 3 rows; the text has more');
	});
	it('does not count blank lines against the limit', () => {
		const text = '1,2\n\n\n\n3,4\n\n\n5,6\n\n';
		expect(parseTwoColumnText(text, ['E', 'signal'], 3).problems).toEqual([]);
		expect(parseTwoColumnText(text, ['E', 'signal'], 3).tooMany).toBeNull();
		expect(parseTwoColumnText(text, ['E', 'signal'], 3).rows).toHaveLength(3);
	});
});

describe('calculation errors', () => {
	it('state the time limit in words people read', () => {
		expect(new CalcTimeLimitError(300).message).toMatch(
			/^The calculation was stopped after 300 ms/
		);
		expect(new CalcTimeLimitError(10_000).message).toMatch(/after 10 s, its time limit/);
		expect(new CalcTimeLimitError(2500).message).toMatch(/after 2\.5 s/);
	});
});
