/*
 * Whether a scroll area's content is wider than the area, followed as either changes size. One
 * rule for ScrollArea.svelte on hydrated pages and for the enhancement script of the pages that
 * are not hydrated (entryPage.ts).
 */

/** Calls `onChange` now and whenever the answer may have changed; returns the disconnect. */
export function watchOverflow(area: HTMLElement, onChange: (overflowing: boolean) => void) {
	const measure = () => onChange(area.scrollWidth > area.clientWidth + 1);
	const observer = new ResizeObserver(measure);
	observer.observe(area);
	if (area.firstElementChild) observer.observe(area.firstElementChild);
	measure();
	return () => observer.disconnect();
}
