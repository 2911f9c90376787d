import { PLOT_COLOURS, type PlotFrame } from './spectrumPlot';

/*
 * A drawn spectrum saved as a file, in the browser: the SVG as it stands (without the cursor and
 * the drag box), or a PNG painted on a canvas from the same marks at twice the size (the site's
 * CSP allows no blob: or data: images, so the SVG cannot be loaded as an image to rasterise).
 * Used by SpectrumPlot.svelte and by the entry pages' script.
 */

/** Offers `blob` for download as `name`. */
export function saveBlob(blob: Blob, name: string): void {
	const url = URL.createObjectURL(blob);
	const a = document.createElement('a');
	a.href = url;
	a.download = name;
	a.click();
	setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The SVG as a standalone file: no cursor, no page classes or ARIA, its size written out. */
export function svgFileText(svg: SVGSVGElement, frame: PlotFrame): string {
	const copy = svg.cloneNode(true) as SVGSVGElement;
	copy.querySelectorAll('[data-interactive]').forEach((n) => n.remove());
	for (const name of copy.getAttributeNames())
		if (name === 'class' || name === 'role' || name === 'tabindex' || name.startsWith('aria-'))
			copy.removeAttribute(name);
	copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
	copy.setAttribute('width', String(frame.width));
	copy.setAttribute('height', String(frame.height));
	return new XMLSerializer().serializeToString(copy);
}

/** Paints the SVG's `[data-paint]` lines, paths and texts on a canvas; calls back with the PNG. */
export function paintPng(
	svg: SVGSVGElement,
	frame: PlotFrame,
	done: (png: Blob | null) => void
): void {
	const { width, height, margin } = frame;
	const scale = 2;
	const canvas = document.createElement('canvas');
	canvas.width = width * scale;
	canvas.height = height * scale;
	const c = canvas.getContext('2d');
	if (!c) return done(null);
	c.scale(scale, scale);
	c.fillStyle = '#ffffff';
	c.fillRect(0, 0, width, height);
	for (const el of svg.querySelectorAll<SVGElement>('[data-paint]')) {
		const stroke = el.getAttribute('stroke');
		const fill = el.getAttribute('fill');
		c.lineWidth = Number(el.getAttribute('stroke-width') ?? 1);
		if (el instanceof SVGLineElement) {
			c.beginPath();
			c.moveTo(el.x1.baseVal.value, el.y1.baseVal.value);
			c.lineTo(el.x2.baseVal.value, el.y2.baseVal.value);
			c.strokeStyle = stroke ?? PLOT_COLOURS.ink;
			c.stroke();
		} else if (el instanceof SVGPathElement) {
			c.save();
			c.beginPath();
			c.rect(
				margin.left,
				margin.top,
				width - margin.left - margin.right,
				height - margin.top - margin.bottom
			);
			c.clip();
			c.strokeStyle = stroke ?? PLOT_COLOURS.trace;
			c.stroke(new Path2D(el.getAttribute('d') ?? ''));
			c.restore();
		} else if (el instanceof SVGTextElement) {
			c.fillStyle = fill ?? PLOT_COLOURS.ink;
			c.font = `${el.getAttribute('font-size') ?? 11}px 'Noto Sans', sans-serif`;
			const anchor = el.getAttribute('text-anchor');
			c.textAlign = anchor === 'middle' ? 'center' : anchor === 'end' ? 'right' : 'left';
			c.textBaseline = 'middle';
			const tx = Number(el.getAttribute('x') ?? 0);
			const ty = Number(el.getAttribute('y') ?? 0);
			if (el.hasAttribute('data-vertical')) {
				c.save();
				c.translate(tx, ty);
				c.rotate(-Math.PI / 2);
				c.fillText(el.textContent ?? '', 0, 0);
				c.restore();
			} else c.fillText(el.textContent ?? '', tx, ty);
		}
	}
	canvas.toBlob(done, 'image/png');
}
