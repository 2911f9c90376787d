/*
 * The reader's access date in a citation. Only the reader's browser knows their calendar date,
 * so the server writes each citation with holes where the date goes (citation.ts,
 * `citationTemplates`) and the page fills them in with this module alone: what a reader copies
 * is byte for byte what the server sends for that date (`cite.bib?accessed=…`), and the page
 * carries none of the code that writes citations.
 */

/** A calendar date, YYYY-MM-DD. */
export type CalendarDate = string;

/** The reader's local calendar date (in the browser: the reader's own time zone). */
export function localCalendarDate(d: Date): CalendarDate {
	const pad = (n: number) => String(n).padStart(2, '0');
	return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
}

const part = (date: CalendarDate, index: number) => String(Number(date.split('-')[index]));

/** The ways a citation writes an access date, by the name of a hole. */
export const ACCESS_DATE_FORMS = {
	/** 2026-03-02: BibTeX's `urldate` and note, plain text. */
	iso: (date: CalendarDate) => date,
	/** 2026/03/02: RIS. */
	slashed: (date: CalendarDate) => date.replaceAll('-', '/'),
	/** 2026, 3 and 2: CSL-JSON's `date-parts`, as JSON numbers. */
	year: (date: CalendarDate) => part(date, 0),
	month: (date: CalendarDate) => part(date, 1),
	day: (date: CalendarDate) => part(date, 2)
} as const;

export type AccessDateForm = keyof typeof ACCESS_DATE_FORMS;

export const isAccessDateForm = (name: string): name is AccessDateForm =>
	Object.hasOwn(ACCESS_DATE_FORMS, name);

/** A citation's text in pieces: text as it stands, and holes for the access date. */
export type DatedText = readonly (string | { accessed: AccessDateForm })[];

/** The text with the access date written into each of its holes. */
export function fillAccessDate(text: DatedText, date: CalendarDate): string {
	return text
		.map((piece) => (typeof piece === 'string' ? piece : ACCESS_DATE_FORMS[piece.accessed](date)))
		.join('');
}
