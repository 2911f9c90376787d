import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	decodeCursor,
	encodeCursor,
	encodeOffsetCursor,
	MAX_CURSOR_LENGTH,
	type KeysetCursor
} from '$lib/schemas/pagination';

describe('cursors', () => {
	it('round-trip a keyset position: list, sort, order, direction, key and id', () => {
		const keyValue = fc.oneof(
			fc.string({ maxLength: 300, unit: 'binary' }),
			fc.double({ noNaN: true, noDefaultInfinity: true }),
			fc.integer(),
			fc.constant(null)
		);
		fc.assert(
			fc.property(
				fc.constantFrom('potentials', 'proteins', 'spin-records'),
				fc.constantFrom('em', 'name', 'relevance'),
				fc.constantFrom<'asc' | 'desc'>('asc', 'desc'),
				fc.constantFrom<'next' | 'prev'>('next', 'prev'),
				fc.array(keyValue, { maxLength: 3 }),
				fc.integer({ min: 1, max: 2 ** 40 }),
				(list, sort, order, direction, key, id) => {
					const cursor: Omit<KeysetCursor, 'kind'> = { list, sort, order, direction, key, id };
					const text = encodeCursor(cursor);
					expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
					// -0 travels through JSON as 0, which sorts the same.
					const same = {
						kind: 'keyset',
						...cursor,
						key: key.map((v) => (Object.is(v, -0) ? 0 : v))
					};
					expect(decodeCursor(text)).toEqual(same);
				}
			)
		);
	});
	it('still read the offset cursors issued before keyset cursors', () =>
		expect(decodeCursor(encodeOffsetCursor(300))).toEqual({ kind: 'offset', offset: 300 }));
	it('reject anything else', () => {
		const valid = encodeCursor({
			list: 'potentials',
			sort: 'em',
			order: 'asc',
			direction: 'next',
			key: [-120],
			id: 7
		});
		for (const bad of [
			'',
			'abc',
			'!!',
			valid.slice(1),
			encodeOffsetCursor(1).slice(1),
			btoa('o:-1'),
			btoa('k:[1,2]'),
			btoa('k:["potentials","em","up","n",[],1]'),
			btoa('k:["potentials","em","asc","n",[{}],1]'),
			btoa('k:["potentials","em","asc","n",[],0]'),
			'A'.repeat(MAX_CURSOR_LENGTH + 1)
		])
			expect(decodeCursor(bad), bad).toBeNull();
	});
});
