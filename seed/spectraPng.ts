import { Jimp, loadFont, measureText } from 'jimp';
import { SANS_14_BLACK } from 'jimp/fonts';
import { gAtField, resonanceFieldMt } from '../src/lib/science';
import type { SyntheticSpectrum } from './spectra';

/*
 * A demo spectrum drawn into a PNG with jimp, the way a spectrometer's export would look: a
 * frame, ticks with labels on both axes, the axis titles, the trace, and for EPR the g scale on
 * the top edge. jimp has no vector drawing, so lines are rasterised here (Bresenham's algorithm,
 * drawn as a square pen of the given width); text uses jimp's bundled bitmap font, which has
 * no Unicode minus, so labels use ASCII.
 */

export interface PngPlotOptions {
	/** @default 960 */
	width?: number;
	/** @default 600 */
	height?: number;
	/** Draw a g axis along the top edge, computed at this microwave frequency (GHz). */
	gAxisFrequencyGHz?: number;
	/** A line of text above the plot, e.g. "demo data (synthetic)". */
	title?: string;
}

const WHITE = 0xffffffff;
const INK = 0x1f2933ff;
const TRACE = 0x1d4ed8ff;
const GRID = 0xe5e7ebff;

/** Round tick values covering [lo, hi], about `count` of them (1, 2 or 5 × 10ᵏ apart). */
export function niceTicks(lo: number, hi: number, count: number): number[] {
	const raw = (hi - lo) / count;
	const power = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
	const out: number[] = [];
	for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) {
		out.push(Number((Math.round(v / step) * step).toPrecision(12)));
	}
	return out;
}

/** The bitmap font has ASCII glyphs only: the few symbols of our axis titles spelt out. */
export function asciiLabel(text: string): string {
	return text
		.replace(/[\u2212\u2013]/g, '-')
		.replace(/χ/g, 'chi')
		.replace(/″/g, "''")
		.replace(/[^\x20-\x7e]/g, '?');
}

function label(v: number): string {
	return String(Number(v.toPrecision(6)));
}

/** The spectrum as PNG bytes. */
export async function renderSpectrumPng(
	spectrum: SyntheticSpectrum,
	options: PngPlotOptions = {}
): Promise<Buffer> {
	const width = options.width ?? 960;
	const height = options.height ?? 600;
	const image = new Jimp({ width, height, color: WHITE });
	const font = await loadFont(SANS_14_BLACK);
	const data = image.bitmap.data;

	const set = (x: number, y: number, colour: number) => {
		if (x < 0 || y < 0 || x >= width || y >= height) return;
		const i = (y * width + x) * 4;
		data[i] = (colour >>> 24) & 0xff;
		data[i + 1] = (colour >>> 16) & 0xff;
		data[i + 2] = (colour >>> 8) & 0xff;
		data[i + 3] = colour & 0xff;
	};
	const line = (x0: number, y0: number, x1: number, y1: number, colour: number, pen = 1) => {
		// Bresenham over integer pixels; a pen wider than 1 stamps a square at each step.
		let [x, y] = [Math.round(x0), Math.round(y0)];
		const [xe, ye] = [Math.round(x1), Math.round(y1)];
		const dx = Math.abs(xe - x);
		const dy = -Math.abs(ye - y);
		const sx = x < xe ? 1 : -1;
		const sy = y < ye ? 1 : -1;
		let err = dx + dy;
		const lo = -Math.floor((pen - 1) / 2);
		const hi = lo + pen - 1;
		for (;;) {
			for (let a = lo; a <= hi; a++) for (let b = lo; b <= hi; b++) set(x + a, y + b, colour);
			if (x === xe && y === ye) break;
			const e2 = 2 * err;
			if (e2 >= dy) {
				err += dy;
				x += sx;
			}
			if (e2 <= dx) {
				err += dx;
				y += sy;
			}
		}
	};
	const text = (raw: string, x: number, y: number, align: 'left' | 'centre' | 'right' = 'left') => {
		const s = asciiLabel(raw);
		const w = measureText(font, s);
		const left = align === 'left' ? x : align === 'centre' ? x - w / 2 : x - w;
		image.print({ font, x: Math.round(left), y: Math.round(y), text: s });
	};

	const g = options.gAxisFrequencyGHz;
	const margin = { left: 90, right: 30, top: g ? 70 : 40, bottom: 70 };
	const xs = spectrum.points.map((p) => p[0]);
	const ys = spectrum.points.map((p) => p[1]);
	const [xMin, xMax] = [Math.min(...xs), Math.max(...xs)];
	const yPad = (Math.max(...ys) - Math.min(...ys)) * 0.05 || 1;
	const [yMin, yMax] = [Math.min(...ys) - yPad, Math.max(...ys) + yPad];
	const px = (v: number) =>
		margin.left + ((v - xMin) / (xMax - xMin)) * (width - margin.left - margin.right);
	const py = (v: number) =>
		height - margin.bottom - ((v - yMin) / (yMax - yMin)) * (height - margin.top - margin.bottom);
	const [left, right, top, bottom] = [
		margin.left,
		width - margin.right,
		margin.top,
		height - margin.bottom
	];

	for (const t of niceTicks(yMin, yMax, 6)) {
		line(left, py(t), right, py(t), GRID);
		line(left - 6, py(t), left, py(t), INK);
		text(label(t), left - 10, py(t) - 8, 'right');
	}
	for (const t of niceTicks(xMin, xMax, 8)) {
		line(px(t), top, px(t), bottom, GRID);
		line(px(t), bottom, px(t), bottom + 6, INK);
		text(label(t), px(t), bottom + 10, 'centre');
	}
	if (g) {
		// g falls as the field rises: ticks at round g values placed at their resonance fields.
		const [gHigh, gLow] = [gAtField(Math.max(xMin, 1e-9), g), gAtField(xMax, g)];
		for (const t of niceTicks(gLow, Math.min(gHigh, 50), 6)) {
			const x = px(resonanceFieldMt(t, g));
			if (x < left || x > right) continue;
			line(x, top - 6, x, top, INK);
			text(label(t), x, top - 26, 'centre');
		}
		text('g', left - 10, top - 26, 'right');
	}
	line(left, top, right, top, INK, 2);
	line(left, bottom, right, bottom, INK, 2);
	line(left, top, left, bottom, INK, 2);
	line(right, top, right, bottom, INK, 2);

	spectrum.points.forEach(([x, y], k) => {
		const previous = spectrum.points[k - 1];
		if (previous) line(px(previous[0]), py(previous[1]), px(x), py(y), TRACE, 2);
	});

	text(spectrum.xHeader, (left + right) / 2, height - 30, 'centre');
	// The y title sits above the axis (jimp's print does not rotate text).
	text(spectrum.yHeader, 10, g ? 10 : top - 30);
	if (options.title) text(options.title, right, g ? 10 : top - 30, 'right');
	return image.getBuffer('image/png');
}
