import { describe, expect, it } from 'vitest';
import { decodeCursor, encodeCursor } from '$lib/schemas/pagination';

describe('cursors', () => {
	it('round-trip an offset', () => expect(decodeCursor(encodeCursor(300))).toBe(300));
	it('reject anything else', () => {
		for (const bad of ['', 'abc', '!!', encodeCursor(1).slice(1), btoa('o:-1')])
			expect(decodeCursor(bad)).toBeNull();
	});
});
