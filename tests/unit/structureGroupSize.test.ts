import { describe, expect, it } from 'vitest';
import { readStructureText } from '$lib/science';

// A cofactor group may not hold more atoms than any real cofactor (readStructureText, MAX_GROUP_ATOMS).
// The edge-to-edge search compares every atom of one group with every atom of another on the
// plan step: two groups of 60 000 atoms, far apart, in a 0.4 MB gzipped file once held the event
// loop for 46 s. The read step must refuse such a group with a 400 that says why.

function hetatm(serial: number, resName: string, chain: string, seq: number, x: number): string {
	return (
		'HETATM' +
		String(serial % 100000).padStart(5) +
		' ' +
		'FE1 ' +
		' ' +
		resName +
		' ' +
		chain +
		String(seq).padStart(4) +
		'    ' +
		x.toFixed(3).padStart(8) +
		(0).toFixed(3).padStart(8) +
		(0).toFixed(3).padStart(8) +
		'  1.00 20.00          FE'
	);
}

describe('the size of one cofactor group', () => {
	it('a group of 5000 atoms (no real cofactor has more than about a hundred heavy atoms) is refused', () => {
		const lines: string[] = [];
		for (let i = 0; i < 5000; i++) lines.push(hetatm(i + 1, 'SF4', 'A', 1, i * 0.001));
		lines.push(hetatm(5001, 'HEM', 'A', 2, 500));
		let thrown: unknown = null;
		try {
			readStructureText(lines.join('\n'), []);
		} catch (e) {
			thrown = e;
		}
		expect(thrown).toBeInstanceOf(RangeError);
		expect((thrown as Error).message).toMatch(/SF4 A1.*atoms/);
	});
});
