import { formatNumber } from '$lib/format/numbers';
import { paintPng, saveBlob, svgFileText } from '$lib/components/spectrumDownloads';
import {
	PLOT_COLOURS,
	dragZoom,
	nearestPoint,
	plotKey,
	plotScene,
	pointReadout,
	type PlotScene,
	type PreparedSpectrum
} from '$lib/components/spectrumPlot';

/*
 * The plots of an entry page, which is served without hydration (see DEVELOPERS.md, "Documents
 * without hydration"): SpectrumPlot.svelte renders the SVG on the server and leaves the plotted
 * numbers in `data-spectrum-plot` and its buttons in a <template>; this script gives that SVG the
 * component's behaviour — drag to zoom, Reset, values on hover and by keyboard, SVG and PNG
 * downloads — drawing with the same geometry (spectrumPlot.ts's plotScene). Loaded only by
 * pages that have a plot. Without it the plot, its notes and the data file's link still work.
 */

const SVG = 'http://www.w3.org/2000/svg';

interface Embedded {
	xs: number[];
	ys: number[];
	xLabel: string;
	yLabel: string;
	gAxisGHz: number | null;
	fileStem: string;
}

function svgElement(tag: string, attrs: Record<string, string | number>): SVGElement {
	const el = document.createElementNS(SVG, tag);
	for (const [name, value] of Object.entries(attrs)) el.setAttribute(name, String(value));
	return el;
}

function enhance(figure: HTMLElement): void {
	const svg = figure.querySelector('svg');
	const readout = figure.querySelector<HTMLElement>('[data-spectrum-readout]');
	const template = figure.querySelector<HTMLTemplateElement>('template[data-spectrum-controls]');
	if (!svg || !readout || !template) return;
	const embedded = JSON.parse(figure.dataset.spectrumPlot ?? '') as Embedded;
	const prepared: PreparedSpectrum = { ...embedded, note: null };
	const clipId = svg.dataset.clipId ?? '';
	const { mark, trace } = PLOT_COLOURS;

	template.replaceWith(template.content.cloneNode(true));
	const button = (action: string) =>
		figure.querySelector<HTMLButtonElement>(`[data-spectrum-action="${action}"]`);
	const reset = button('reset');

	let zoom: [number, number] | null = null;
	let cursor: number | null = null;
	let dragFrom: number | null = null;
	let dragTo: number | null = null;
	let scene: PlotScene = plotScene(prepared, figure.clientWidth, null, formatNumber);

	/** Draws the frame, marks and trace for the current width and zoom, then the cursor. */
	function draw(): void {
		if (!svg) return;
		scene = plotScene(prepared, figure.clientWidth, zoom, formatNumber);
		const { width, height, margin } = scene.frame;
		svg.setAttribute('viewBox', `0 0 ${width} ${height}`);
		const clip = svg.querySelector('clipPath rect');
		clip?.setAttribute('x', String(margin.left));
		clip?.setAttribute('y', String(margin.top));
		clip?.setAttribute('width', String(width - margin.left - margin.right));
		clip?.setAttribute('height', String(height - margin.top - margin.bottom));
		const background = svg.querySelector(':scope > rect');
		background?.setAttribute('width', String(width));
		background?.setAttribute('height', String(height));
		svg.querySelectorAll('[data-paint]').forEach((n) => n.remove());
		for (const m of scene.marks) {
			const el = svgElement(m.tag, { 'data-paint': '', ...m.attrs });
			if (m.text !== undefined) el.textContent = m.text;
			svg.append(el);
		}
		svg.append(
			svgElement('path', {
				'data-paint': '',
				d: scene.path,
				fill: 'none',
				stroke: trace,
				'stroke-width': 1.5,
				'clip-path': `url(#${clipId})`
			})
		);
		svg.setAttribute('aria-valuemax', String(scene.visible.length));
		if (reset) reset.disabled = zoom === null;
		drawCursor();
	}

	/** The drag box, the chosen point and its values in words. */
	function drawCursor(): void {
		if (!svg || !readout) return;
		svg.querySelectorAll('[data-interactive]').forEach((n) => n.remove());
		const { height, margin } = scene.frame;
		if (dragFrom !== null && dragTo !== null)
			svg.append(
				svgElement('rect', {
					'data-interactive': '',
					x: Math.min(dragFrom, dragTo),
					y: margin.top,
					width: Math.abs(dragTo - dragFrom),
					height: height - margin.top - margin.bottom,
					fill: mark,
					'fill-opacity': 0.15,
					stroke: mark
				})
			);
		const text = pointReadout(prepared, cursor, formatNumber);
		if (cursor !== null) {
			const cx = scene.px(prepared.xs[cursor] ?? 0);
			svg.append(
				svgElement('line', {
					'data-interactive': '',
					x1: cx,
					x2: cx,
					y1: margin.top,
					y2: height - margin.bottom,
					stroke: mark,
					'stroke-dasharray': '3 3'
				}),
				svgElement('circle', {
					'data-interactive': '',
					cx,
					cy: scene.py(prepared.ys[cursor] ?? 0),
					r: 4,
					fill: mark
				})
			);
		}
		readout.textContent = text;
		svg.setAttribute(
			'aria-valuenow',
			String(cursor === null ? 1 : scene.visible.indexOf(cursor) + 1)
		);
		svg.setAttribute('aria-valuetext', text || 'no point chosen; use the arrow keys');
	}

	const svgX = (event: PointerEvent) => {
		const box = svg.getBoundingClientRect();
		return box.width === 0 ? 0 : ((event.clientX - box.left) / box.width) * scene.frame.width;
	};
	svg.addEventListener('pointerdown', (event) => {
		if (event.button !== 0) return;
		dragFrom = dragTo = svgX(event);
		svg.setPointerCapture(event.pointerId);
	});
	svg.addEventListener('pointermove', (event) => {
		const px = svgX(event);
		if (dragFrom !== null) dragTo = px;
		cursor = nearestPoint(prepared, scene, px);
		drawCursor();
	});
	svg.addEventListener('pointerup', () => {
		const range =
			dragFrom !== null && dragTo !== null ? dragZoom(prepared, scene, dragFrom, dragTo) : null;
		dragFrom = dragTo = null;
		if (range) {
			zoom = range;
			draw();
		} else drawCursor();
	});
	svg.addEventListener('pointerleave', () => {
		if (dragFrom !== null) return;
		cursor = null;
		drawCursor();
	});
	svg.addEventListener('keydown', (event) => {
		const outcome = plotKey(prepared, scene, cursor, event.key, event.shiftKey);
		if ('nothing' in outcome) return;
		event.preventDefault();
		if ('cursor' in outcome) {
			cursor = outcome.cursor;
			drawCursor();
		} else {
			zoom = outcome.zoom;
			draw();
		}
	});
	reset?.addEventListener('click', () => {
		zoom = null;
		draw();
	});
	button('svg')?.addEventListener('click', () =>
		saveBlob(
			new Blob([svgFileText(svg, scene.frame)], { type: 'image/svg+xml' }),
			`${embedded.fileStem}.svg`
		)
	);
	button('png')?.addEventListener('click', () =>
		paintPng(svg, scene.frame, (png) => {
			if (png) saveBlob(png, `${embedded.fileStem}.png`);
		})
	);
	// Drawn at the width it is shown at, as the component does once measured.
	let shownWidth = -1;
	new ResizeObserver(() => {
		if (figure.clientWidth === shownWidth) return;
		shownWidth = figure.clientWidth;
		draw();
	}).observe(figure);
}

for (const figure of document.querySelectorAll<HTMLElement>('[data-spectrum-plot]'))
	enhance(figure);
