import { describe, expect, it } from 'vitest';
import type { Ladder, LadderStep } from '$lib/catalogue/ladder';
import { NARROW_LADDER, WIDE_LADDER, drawLadder } from '$lib/catalogue/ladderLayout';

const step = (centre: string, emMv: number | null): LadderStep => ({
	centre,
	label: centre,
	emMv,
	potential: null,
	couple: null,
	ph: null,
	temperatureK: null
});
const ladder: Ladder = {
	steps: [step('A', -420), step('B', null), step('C', -150), step('D', 80)],
	hops: [],
	branches: [],
	conditions: { ph: 7, temperatureK: 298.15 }
};

describe('the energy ladder’s drawing', () => {
	it.each([NARROW_LADDER, WIDE_LADDER])('puts more reducing centres higher up', (layout) => {
		const d = drawLadder(ladder, layout);
		expect(d.y.A).toBeLessThan(d.y.C ?? 0);
		expect(d.y.C).toBeLessThan(d.y.D ?? 0);
		expect(d.y).not.toHaveProperty('B');
		for (const y of Object.values(d.y)) {
			expect(y).toBeGreaterThanOrEqual(layout.margin.top);
			expect(y).toBeLessThanOrEqual(layout.height - layout.margin.bottom);
		}
	});
	it.each([NARROW_LADDER, WIDE_LADDER])(
		'keeps chain order left to right inside the margins',
		(l) => {
			const d = drawLadder(ladder, l);
			const xs = ['A', 'B', 'C', 'D'].map((c) => d.x[c] ?? NaN);
			expect(xs).toEqual([...xs].sort((a, b) => a - b));
			expect(xs[0]).toBeGreaterThanOrEqual(l.margin.left);
			expect((xs[3] ?? 0) + d.bandwidth).toBeLessThanOrEqual(l.width - l.margin.right);
		}
	);
	it('labels the axis with round values spanning every Em and zero', () => {
		const d = drawLadder(ladder, WIDE_LADDER);
		const values = d.ticks.map((t) => t.value);
		// A 100 mV step over −470…130 mV, widened to round ends (d3's nice ticks).
		expect(values).toEqual([-500, -400, -300, -200, -100, 0, 100]);
		expect(d.ticks.map((t) => t.y)).toEqual([...d.ticks.map((t) => t.y)].sort((a, b) => a - b));
	});
});
