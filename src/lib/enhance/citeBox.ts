import { fillAccessDate, type CalendarDate, type DatedText } from '$lib/catalogue/accessDate';

/*
 * What the "How to cite" strip (CiteBox.svelte) does once a script runs: the reader's own
 * calendar date in the texts, the download links and the line under them; Copy buttons (from
 * the strip's <template>s) that put a text on the clipboard and say so; the format menu closed
 * by Escape, by a click outside and after a copy. Without a script the strip shows the texts
 * without an access date and the downloads work.
 *
 * The strip's markup names what is what (data-cite-* attributes); the texts with holes for the
 * date come as JSON from the server (catalogue/citation.ts, pageCitation) and are filled with
 * catalogue/accessDate.ts, as the files are on the server.
 */

const STATUS_SHOWN_MS = 4000;

const datedOf = (element: Element, name: string): DatedText =>
	JSON.parse(element.getAttribute(name) ?? '[]') as DatedText;

/** The first element of a <template>'s content, copied. */
function fromTemplate<T extends Element>(template: HTMLTemplateElement | null): T | null {
	const first = template?.content.firstElementChild;
	return first ? (first.cloneNode(true) as T) : null;
}

export function enhanceCiteBox(box: HTMLElement, accessed: CalendarDate): void {
	const menu = box.querySelector<HTMLDetailsElement>('details[data-cite-menu]');
	const status = box.querySelector<HTMLElement>('[data-cite-status]');
	let statusTimer: ReturnType<typeof setTimeout> | undefined;
	/** Text the clipboard refused, shown selected so that the reader can copy it by hand. */
	let manual: Element | null = null;

	// The access date, where the reader sees it and in what the links download.
	for (const text of box.querySelectorAll('[data-cite-dated]'))
		text.textContent = fillAccessDate(datedOf(text, 'data-cite-dated'), accessed);
	for (const link of box.querySelectorAll<HTMLAnchorElement>('a[data-cite-download]'))
		link.href = `${link.getAttribute('href')}?accessed=${accessed}`;
	const accessedLine = box.querySelector('[data-cite-accessed]');
	const accessedText = fromTemplate(box.querySelector('template[data-cite-accessed-template]'));
	if (accessedLine && accessedText) {
		const date = accessedText.querySelector('[data-cite-accessed-date]');
		if (date) date.textContent = accessed;
		accessedLine.replaceChildren(...accessedText.childNodes);
	}

	async function copy(label: string, text: string) {
		clearTimeout(statusTimer);
		manual?.remove();
		manual = null;
		try {
			if (!navigator.clipboard) throw new Error('no clipboard');
			await navigator.clipboard.writeText(text);
			if (status) status.textContent = `${label} copied`;
			statusTimer = setTimeout(() => status && (status.textContent = ''), STATUS_SHOWN_MS);
		} catch {
			showManual(label, text);
			if (status)
				status.textContent = `The browser did not allow copying: the ${label} text is selected below, copy it with Ctrl+C (⌘C)`;
		}
		if (menu) menu.open = false;
	}

	function showManual(label: string, text: string) {
		manual = fromTemplate(box.querySelector('template[data-cite-manual-template]'));
		const area = manual?.querySelector('textarea');
		const caption = manual?.querySelector('label');
		if (!manual || !area || !caption) return;
		caption.textContent = label;
		area.value = text;
		accessedLine?.before(manual);
		area.focus();
		area.select();
	}

	// Each Copy button, in the place its <template> keeps for it.
	for (const template of box.querySelectorAll<HTMLTemplateElement>('template[data-cite-copy]')) {
		const button = fromTemplate<HTMLButtonElement>(template);
		if (!button) continue;
		const label = template.dataset.label ?? '';
		const source = template.dataset.of ? document.getElementById(template.dataset.of) : null;
		button.addEventListener('click', () => {
			const text = source
				? (source.textContent ?? '').trim()
				: fillAccessDate(datedOf(template, 'data-dated'), accessed);
			void copy(label, text);
		});
		template.replaceWith(button);
	}

	window.addEventListener('keydown', (event) => {
		if (event.key !== 'Escape' || !menu?.open) return;
		menu.open = false;
		menu.querySelector('summary')?.focus();
	});
	window.addEventListener('click', (event) => {
		if (menu?.open && event.target instanceof Node && !menu.contains(event.target))
			menu.open = false;
	});
}
