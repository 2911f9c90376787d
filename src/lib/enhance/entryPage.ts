import { localCalendarDate } from '$lib/catalogue/accessDate';
import { enhanceCiteBox } from './citeBox';
import { watchOverflow } from './overflow';

/*
 * The one script of the entry pages, which are documents served without hydration
 * (`csr = false` beside the page): what on them needs a script, and only that. Built by Vite
 * from this file and what it imports into one small file, loaded by the page from our own
 * origin (see DEVELOPERS.md, "Documents without hydration").
 */

for (const box of document.querySelectorAll<HTMLElement>('[data-cite-box]'))
	enhanceCiteBox(box, localCalendarDate(new Date()));

// The line "More columns to the side" over a table wider than its scroll area.
for (const area of document.querySelectorAll<HTMLElement>('[data-scroll-area]')) {
	const hint = area.previousElementSibling;
	if (hint instanceof HTMLElement && hint.hasAttribute('data-scroll-hint'))
		watchOverflow(area, (overflowing) => (hint.hidden = !overflowing));
}
