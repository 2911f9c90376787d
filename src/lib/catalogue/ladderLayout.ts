import { scaleBand, scaleLinear } from 'd3-scale';
import type { Ladder } from './ladder';

/*
 * Where the marks of the energy ladder (components/EnergyLadder.svelte) go, worked out on the
 * server so that the page draws an SVG without loading the scales. The ladder is drawn twice,
 * for narrow and wide screens (CSS shows one), each with a viewBox the width it is shown at, so
 * that its text is never drawn below 11 px: the narrow drawing at 360 units shows at about
 * 1 px per unit on a 390 px phone, the wide one at 760 units never narrower than about 600 px.
 */

export interface LadderLayout {
	narrow: boolean;
	width: number;
	height: number;
	margin: { top: number; right: number; bottom: number; left: number };
	/** Font size in viewBox units (= CSS px at the width the drawing is meant for). */
	font: number;
	small: number;
	/** The longest centre label drawn in full; longer ones are cut with "…". */
	labelChars: number;
}

export const NARROW_LADDER: LadderLayout = {
	narrow: true,
	width: 360,
	height: 330,
	margin: { top: 44, right: 6, bottom: 66, left: 42 },
	font: 12,
	small: 12,
	labelChars: 9
};

export const WIDE_LADDER: LadderLayout = {
	narrow: false,
	width: 760,
	height: 360,
	margin: { top: 44, right: 16, bottom: 58, left: 78 },
	font: 14,
	small: 14,
	labelChars: 14
};

/** One drawing of a ladder: the layout, the potential axis's ticks and each centre's place. */
export interface LadderDrawing {
	layout: LadderLayout;
	/** Ticks of the Em axis (mV vs SHE) and their heights. */
	ticks: { value: number; y: number }[];
	/** Width of each centre's band. */
	bandwidth: number;
	/** The left edge of each centre's band, by centre accession. */
	x: Record<string, number>;
	/** The height of each centre's Em, by centre accession (centres with a value only). */
	y: Record<string, number>;
}

export function drawLadder(ladder: Ladder, layout: LadderLayout): LadderDrawing {
	const known = ladder.steps.flatMap((s) => (s.emMv === null ? [] : [s.emMv]));
	const x = scaleBand<string>()
		.domain(ladder.steps.map((s) => s.centre))
		.range([layout.margin.left, layout.width - layout.margin.right])
		.padding(0.2);
	// More negative potentials sit higher: an electron's energy rises as Em falls.
	const y = scaleLinear()
		.domain([Math.min(...known, 0) - 50, Math.max(...known, 0) + 50])
		.nice()
		.range([layout.margin.top, layout.height - layout.margin.bottom]);
	return {
		layout,
		ticks: y.ticks(layout.narrow ? 5 : 6).map((value) => ({ value, y: y(value) })),
		bandwidth: x.bandwidth(),
		x: Object.fromEntries(ladder.steps.map((s) => [s.centre, x(s.centre) ?? 0])),
		y: Object.fromEntries(
			ladder.steps.flatMap((s) => (s.emMv === null ? [] : [[s.centre, y(s.emMv)]]))
		)
	};
}

/** Both drawings of a ladder, as the page shows them. */
export function drawLadders(ladder: Ladder): { narrow: LadderDrawing; wide: LadderDrawing } {
	return { narrow: drawLadder(ladder, NARROW_LADDER), wide: drawLadder(ladder, WIDE_LADDER) };
}
