import { describe, expect, it } from 'vitest';
import { preferredRepresentation } from '$lib/server/citations/negotiate';
import { checkAccessDate } from '$lib/server/citations/files';

// RFC 9110 §12.5.1 (Accept): q-values rank media ranges; a missing header accepts anything.
describe('what a permalink answers for an Accept header', () => {
	it.each([
		[null, 'html'],
		['*/*', 'html'],
		['text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8', 'html'],
		['application/x-bibtex', 'bib'],
		['application/x-research-info-systems', 'ris'],
		['application/vnd.citationstyles.csl+json', 'json'],
		['application/json', 'entry-json'],
		['text/html;q=0.5, application/x-bibtex', 'bib'],
		['application/x-bibtex;q=0.5, text/html', 'html'],
		['application/*', 'html'],
		['image/png', 'html']
	])('%j → %s', (accept, wanted) => expect(preferredRepresentation(accept)).toBe(wanted));
});

describe('an access date the server accepts', () => {
	// At 11:00 UTC it is already the next day at UTC+14 (Kiritimati) but never the day after.
	const now = new Date('2026-12-01T11:00:00Z');
	it.each(['2026-11-30', '2026-12-01', '2026-12-02'])('%s is today somewhere', (date) =>
		expect(() => checkAccessDate(date, now)).not.toThrow()
	);
	it.each(['2026-11-29', '2026-12-03', '1999-01-01'])('%s is today nowhere', (date) =>
		expect(() => checkAccessDate(date, now)).toThrow(/is not today's date anywhere/)
	);
});
