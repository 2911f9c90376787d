import { describe, expect, it } from 'vitest';
import { diffEntryData } from '$lib/catalogue/diff';

describe('version diff', () => {
	it('lists only changed fields, in order', () => {
		expect(
			diffEntryData({ a: 1, b: [1, 2], c: 'x' }, { a: 1, b: [1, 3], c: 'y', d: null })
		).toEqual([
			{ field: 'b', before: [1, 2], after: [1, 3] },
			{ field: 'c', before: 'x', after: 'y' }
		]);
	});
});
