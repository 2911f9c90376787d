import { scaleLinear } from 'd3-scale';
import {
	REFERENCE_ELECTRODE_LABELS,
	electrodeOffsetMv,
	fieldToMt,
	gAtField,
	potentialAxisToSheMv,
	resonanceFieldMt,
	type ReferenceElectrode
} from '$lib/science';
import { fieldUnitOf, potentialUnitOf, type SpectrumData } from '$lib/schemas/spectrumData';

/*
 * What SpectrumPlot.svelte draws, worked out apart from the markup so it can be tested: the x
 * values on the axis the reader needs (mT for EPR, mV vs SHE for a voltammogram, through the
 * science module's one conversion each), the g ticks of the top axis, a thinned path for long
 * sweeps, and the CSV offered for download.
 */

export type SpectrumKind = 'epr' | 'voltammogram' | 'other';

export interface SpectrumConditions {
	kind: SpectrumKind;
	/** EPR microwave frequency, GHz: turns on the g axis. */
	frequencyGHz?: number | null;
	/** The electrode a voltammogram was recorded against: turns on the SHE axis. */
	electrode?: ReferenceElectrode | null;
	/** Cell temperature, K (the SCE offset follows it; Ag/AgCl holds within 15–35 °C). */
	temperatureK?: number | null;
}

export interface PreparedSpectrum {
	/** x on the plotted axis. */
	xs: number[];
	ys: number[];
	xLabel: string;
	yLabel: string;
	/** The microwave frequency when a g axis is drawn on top. */
	gAxisGHz: number | null;
	/** How the x axis was obtained from the file, or why it could not be converted. */
	note: string | null;
}

const labelOf = (name: string, unit: string | null) => (unit ? `${name} (${unit})` : name);

export function prepareSpectrum(
	data: SpectrumData,
	conditions: SpectrumConditions
): PreparedSpectrum {
	const xs = data.points.map((p) => p[0]);
	const ys = data.points.map((p) => p[1]);
	const plain: PreparedSpectrum = {
		xs,
		ys,
		xLabel: labelOf(data.x.name, data.x.unit),
		yLabel: labelOf(data.y.name, data.y.unit),
		gAxisGHz: null,
		note: null
	};
	if (conditions.kind === 'epr') {
		const unit = fieldUnitOf(data.x.unit);
		const nu = conditions.frequencyGHz ?? null;
		if (unit === null) return { ...plain, note: 'no g axis: the field column has no unit' };
		const mt = xs.map((x) => fieldToMt(x, unit));
		const fieldOk = mt.every((b) => b > 0);
		return {
			...plain,
			xs: mt,
			xLabel: `${data.x.name} (mT)`,
			gAxisGHz: nu !== null && nu > 0 && fieldOk ? nu : null,
			note:
				nu === null || !(nu > 0)
					? 'no g axis: the microwave frequency is not given'
					: fieldOk
						? `g = hν/(μ_B·B) at ${nu} GHz (CODATA 2018 constants)`
						: 'no g axis: the field does not stay above zero'
		};
	}
	if (conditions.kind === 'voltammogram') {
		const unit = potentialUnitOf(data.x.unit);
		const electrode = conditions.electrode ?? null;
		if (unit === null || electrode === null) {
			return {
				...plain,
				note: `potential as in the file: ${unit === null ? 'its unit is not V or mV' : 'the reference electrode is not given'}`
			};
		}
		const t = conditions.temperatureK ?? undefined;
		try {
			const she = potentialAxisToSheMv(xs, unit, electrode, t);
			const offset = electrodeOffsetMv(electrode, t);
			return {
				...plain,
				xs: she,
				xLabel: `${data.x.name} (mV vs SHE)`,
				note: `converted from ${unit} vs ${REFERENCE_ELECTRODE_LABELS[electrode]}: ${offset >= 0 ? '+' : '−'}${Math.abs(offset).toFixed(1)} mV`
			};
		} catch (e) {
			// A temperature outside the electrode's range: shown as recorded, and why.
			return {
				...plain,
				note: `potential as in the file (vs ${REFERENCE_ELECTRODE_LABELS[electrode]}): ${e instanceof Error ? e.message : 'no conversion'}`
			};
		}
	}
	return plain;
}

/**
 * Indices of the points to draw: all of them up to `budget`; beyond, the first and the lowest
 * and highest y of each run of consecutive points (in file order, so a cyclic sweep stays a
 * loop), which keeps every peak a reader could see at the plot's width.
 */
export function thinnedIndices(ys: readonly number[], budget = 2000): number[] {
	if (ys.length <= budget) return ys.map((_, i) => i);
	// Up to three points a run (first, lowest, highest): runs of 3·n/budget stay within it.
	const run = Math.ceil((ys.length * 3) / budget);
	const out: number[] = [];
	for (let start = 0; start < ys.length; start += run) {
		const end = Math.min(ys.length, start + run);
		let lo = start;
		let hi = start;
		for (let i = start; i < end; i++) {
			if ((ys[i] ?? 0) < (ys[lo] ?? 0)) lo = i;
			if ((ys[i] ?? 0) > (ys[hi] ?? 0)) hi = i;
		}
		out.push(...[...new Set([start, lo, hi])].sort((a, b) => a - b));
	}
	if (out.at(-1) !== ys.length - 1) out.push(ys.length - 1);
	return out;
}

/** Round g values inside the field range [loMt, hiMt], with the field where each sits. */
export function gTicks(
	loMt: number,
	hiMt: number,
	frequencyGHz: number,
	count = 6
): { g: number; fieldMt: number }[] {
	if (!(loMt > 0 && hiMt > loMt)) return [];
	const [gLow, gHigh] = [gAtField(hiMt, frequencyGHz), gAtField(loMt, frequencyGHz)];
	return scaleLinear()
		.domain([gLow, gHigh])
		.ticks(count)
		.filter((g) => g > 0)
		.map((g) => ({ g, fieldMt: resonanceFieldMt(g, frequencyGHz) }))
		.filter((t) => t.fieldMt >= loMt && t.fieldMt <= hiMt);
}

/** The plotted numbers as CSV: the file's columns, plus the converted axis when there is one. */
export function spectrumCsvText(data: SpectrumData, prepared: PreparedSpectrum): string {
	// A header from an uploaded file must not turn into a spreadsheet formula when opened.
	const quote = (s: string) => `"${(/^[=+\-@]/.test(s) ? `'${s}` : s).replace(/"/g, '""')}"`;
	const original = labelOf(data.x.name, data.x.unit);
	const converted = prepared.xLabel !== original;
	const header = [original, prepared.yLabel, ...(converted ? [prepared.xLabel] : [])]
		.map(quote)
		.join(',');
	const rows = data.points.map(([x, y], i) =>
		[x, y, ...(converted ? [prepared.xs[i]] : [])].map((v) => String(v)).join(',')
	);
	return [header, ...rows, ''].join('\n');
}

/*
 * The drawing itself, as data: the frame, the axes and labels as marks, and the trace as one
 * path. SpectrumPlot.svelte renders these marks (on the server, and live where the page is
 * hydrated); the entry pages' script ($lib/enhance/spectrumPlot.ts) renders the same marks again
 * after a zoom, so both draw one geometry.
 */

/** Colours as attributes (not classes), so a downloaded SVG looks the same outside the site. */
export const PLOT_COLOURS = {
	ink: '#12343b',
	soft: '#3d5a60',
	line: '#ddd8c8',
	trace: '#237080',
	mark: '#b9801a'
} as const;

export interface PlotFrame {
	width: number;
	height: number;
	margin: { top: number; right: number; bottom: number; left: number };
}

/**
 * The plot's size for the width it is shown at (one SVG unit = one CSS pixel, so labels keep
 * their size on a phone); 640 when not measured yet (the server's rendering).
 */
export function plotFrame(boxWidth: number, hasGAxis: boolean): PlotFrame {
	const width = boxWidth > 0 ? Math.min(640, Math.max(280, Math.round(boxWidth))) : 640;
	return {
		width,
		height: width < 500 ? 280 : 340,
		margin: { top: hasGAxis ? 40 : 14, right: 12, bottom: 46, left: width < 500 ? 52 : 64 }
	};
}

export interface PlotMark {
	tag: 'line' | 'text';
	attrs: Record<string, string | number>;
	text?: string;
}

export interface PlotScene {
	frame: PlotFrame;
	/** The x range shown. */
	domainX: readonly [number, number];
	/** Indices of the points inside it. */
	visible: number[];
	/** Frame, ticks, grid and labels. */
	marks: PlotMark[];
	/** The trace (to be clipped to the frame's inside). */
	path: string;
	/** Data → SVG units, and back for x. */
	px: (x: number) => number;
	py: (y: number) => number;
	invertX: (px: number) => number;
}

/** The full x range of the points. */
export function fullRange(prepared: PreparedSpectrum): [number, number] {
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of prepared.xs) {
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	return [lo, hi];
}

/**
 * Everything drawn for `prepared` at `boxWidth`, zoomed to `zoom` (an x range) or showing all.
 * @param format how tick labels are written (the site's number format).
 */
export function plotScene(
	prepared: PreparedSpectrum,
	boxWidth: number,
	zoom: readonly [number, number] | null,
	format: (v: number) => string
): PlotScene {
	const frame = plotFrame(boxWidth, prepared.gAxisGHz !== null);
	const { width, height, margin } = frame;
	const { ink, soft, line } = PLOT_COLOURS;
	const domainX = zoom ?? fullRange(prepared);
	const visible: number[] = [];
	prepared.xs.forEach((v, i) => {
		if (v >= domainX[0] && v <= domainX[1]) visible.push(i);
	});
	const x = scaleLinear()
		.domain(domainX)
		.range([margin.left, width - margin.right]);
	let [lo, hi] = [Infinity, -Infinity];
	for (const i of visible) {
		const v = prepared.ys[i] ?? 0;
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	if (!Number.isFinite(lo)) [lo, hi] = [0, 1];
	const pad = (hi - lo) * 0.05 || Math.abs(hi) * 0.05 || 1;
	const y = scaleLinear()
		.domain([lo - pad, hi + pad])
		.nice()
		.range([height - margin.bottom, margin.top]);

	const marks: PlotMark[] = [];
	const lineMark = (x1: number, x2: number, y1: number, y2: number, stroke: string) =>
		marks.push({ tag: 'line', attrs: { x1, x2, y1, y2, stroke } });
	const textMark = (text: string, attrs: Record<string, string | number>) =>
		marks.push({ tag: 'text', attrs, text });
	const small = width < 500;
	for (const t of y.ticks(small ? 5 : 6)) {
		lineMark(margin.left, width - margin.right, y(t), y(t), line);
		textMark(format(t), {
			x: margin.left - 6,
			y: y(t),
			dy: '0.32em',
			'text-anchor': 'end',
			'font-size': 11,
			fill: soft
		});
	}
	for (const t of x.ticks(small ? 4 : 7)) {
		lineMark(x(t), x(t), height - margin.bottom, height - margin.bottom + 5, ink);
		textMark(format(t), {
			x: x(t),
			y: height - margin.bottom + 17,
			'text-anchor': 'middle',
			'font-size': 11,
			fill: soft
		});
	}
	const g = prepared.gAxisGHz
		? gTicks(domainX[0], domainX[1], prepared.gAxisGHz, small ? 4 : 6)
		: [];
	for (const t of g) {
		lineMark(x(t.fieldMt), x(t.fieldMt), margin.top - 5, margin.top, ink);
		textMark(format(t.g), {
			x: x(t.fieldMt),
			y: margin.top - 12,
			'text-anchor': 'middle',
			'font-size': 11,
			fill: soft
		});
	}
	if (g.length > 0)
		textMark('g', {
			x: margin.left - 6,
			y: margin.top - 12,
			'text-anchor': 'end',
			'font-size': 12,
			fill: ink
		});
	const [left, right, top, bottom] = [
		margin.left,
		width - margin.right,
		margin.top,
		height - margin.bottom
	];
	lineMark(left, right, bottom, bottom, ink);
	lineMark(left, right, top, top, ink);
	lineMark(left, left, top, bottom, ink);
	lineMark(right, right, top, bottom, ink);
	textMark(prepared.xLabel, {
		x: (left + right) / 2,
		y: height - 10,
		'text-anchor': 'middle',
		'font-size': 12,
		fill: ink
	});
	const mid = (top + bottom) / 2;
	textMark(prepared.yLabel, {
		'data-vertical': '',
		x: 14,
		y: mid,
		transform: `rotate(-90 14 ${mid})`,
		'text-anchor': 'middle',
		'font-size': 12,
		fill: ink
	});

	return {
		frame,
		domainX,
		visible,
		marks,
		path: tracePath(prepared, domainX, x, y),
		px: (v) => x(v),
		py: (v) => y(v),
		invertX: (p) => x.invert(p)
	};
}

/**
 * The trace inside `domainX`: points just outside the range are kept so the line runs to the
 * frame (the clip cuts it); each unbroken run of kept points is one subpath, thinned on its own
 * (thinnedIndices keeps every peak a reader could see).
 */
function tracePath(
	prepared: PreparedSpectrum,
	domainX: readonly [number, number],
	x: (v: number) => number,
	y: (v: number) => number
): string {
	const inView = (k: number) => {
		const v = prepared.xs[k];
		return v !== undefined && v >= domainX[0] && v <= domainX[1];
	};
	const runs: number[][] = [];
	prepared.xs.forEach((_, i) => {
		if (!(inView(i) || inView(i - 1) || inView(i + 1))) return;
		const last = runs.at(-1);
		if (last && last.at(-1) === i - 1) last.push(i);
		else runs.push([i]);
	});
	const budget = Math.max(200, Math.round(2000 / Math.max(1, runs.length)));
	return runs
		.map((run) => {
			const ys = run.map((i) => prepared.ys[i] ?? 0);
			return thinnedIndices(ys, budget)
				.map((k, j) => {
					const i = run[k] ?? 0;
					return `${j === 0 ? 'M' : 'L'}${x(prepared.xs[i] ?? 0).toFixed(1)},${y(prepared.ys[i] ?? 0).toFixed(1)}`;
				})
				.join('');
		})
		.join('');
}

/** The point nearest to the SVG x position `px`, among the visible ones. */
export function nearestPoint(
	prepared: PreparedSpectrum,
	scene: PlotScene,
	px: number
): number | null {
	const target = scene.invertX(px);
	let best: number | null = null;
	for (const i of scene.visible) {
		const v = prepared.xs[i] ?? 0;
		if (best === null || Math.abs(v - target) < Math.abs((prepared.xs[best] ?? 0) - target))
			best = i;
	}
	return best;
}

/**
 * The x range a drag from `fromPx` to `toPx` selects, or null for a drag too short (≤ 8 px) or
 * one that would leave fewer than two points to draw.
 */
export function dragZoom(
	prepared: PreparedSpectrum,
	scene: PlotScene,
	fromPx: number,
	toPx: number
): [number, number] | null {
	if (Math.abs(toPx - fromPx) <= 8) return null;
	const [a, b] = [scene.invertX(fromPx), scene.invertX(toPx)].sort((p, q) => p - q) as [
		number,
		number
	];
	const full = fullRange(prepared);
	const lo = Math.max(a, full[0]);
	const hi = Math.min(b, full[1]);
	return prepared.xs.filter((v) => v >= lo && v <= hi).length >= 2 ? [lo, hi] : null;
}

export type KeyOutcome =
	{ cursor: number | null } | { zoom: [number, number] | null } | { nothing: true };

/**
 * What a key does on the focused plot: ← → (Shift: a twentieth of the points) Home End move the
 * chosen point, Escape lets go of it; + halves the range about the point (or the middle), −
 * doubles it, 0 shows everything.
 */
export function plotKey(
	prepared: PreparedSpectrum,
	scene: PlotScene,
	cursor: number | null,
	key: string,
	shift: boolean
): KeyOutcome {
	const { visible, domainX } = scene;
	if (visible.length === 0) return { nothing: true };
	const at = cursor === null ? -1 : visible.indexOf(cursor);
	const step = shift ? Math.max(1, Math.round(visible.length / 20)) : 1;
	const pick = (n: number) => ({ cursor: visible[n] ?? null });
	if (key === 'ArrowRight') return pick(Math.min(visible.length - 1, at + step));
	if (key === 'ArrowLeft') return pick(Math.max(0, at < 0 ? 0 : at - step));
	if (key === 'Home') return pick(0);
	if (key === 'End') return pick(visible.length - 1);
	if (key === 'Escape') return { cursor: null };
	if (key === '0') return { zoom: null };
	if (key === '+' || key === '=' || key === '-') {
		const full = fullRange(prepared);
		const centre = cursor === null ? (domainX[0] + domainX[1]) / 2 : (prepared.xs[cursor] ?? 0);
		const half = ((domainX[1] - domainX[0]) / 2) * (key === '-' ? 2 : 0.5);
		const lo = Math.max(full[0], centre - half);
		const hi = Math.min(full[1], centre + half);
		if (lo <= full[0] && hi >= full[1]) return { zoom: null };
		if (prepared.xs.filter((v) => v >= lo && v <= hi).length >= 2) return { zoom: [lo, hi] };
		return { nothing: true };
	}
	return { nothing: true };
}

/** The chosen point's values, in words: "Field (mT): 339.1; Signal: −0.2, g = 2.0023". */
export function pointReadout(
	prepared: PreparedSpectrum,
	i: number | null,
	format: (v: number) => string
): string {
	if (i === null) return '';
	const xv = prepared.xs[i] ?? 0;
	const yv = prepared.ys[i] ?? 0;
	const g =
		prepared.gAxisGHz && xv > 0 ? `, g = ${gAtField(xv, prepared.gAxisGHz).toFixed(4)}` : '';
	return `${prepared.xLabel}: ${format(xv)}; ${prepared.yLabel}: ${format(yv)}${g}`;
}
