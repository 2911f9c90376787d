import { describe, expect, it } from 'vitest';
import { hasSessionCookie } from '$lib/server/auth/sessionCookie';
import { nextUtcMidnight } from '$lib/server/catalogue/revision';
import { etagMatches, isSignedOutRead } from '$lib/server/http/readCache';

const event = (
	routeId: string | null,
	init: { method?: string; headers?: Record<string, string> } = {}
) => ({ request: new Request('http://hopline.test/x', init), route: { id: routeId } });

describe('which reads are kept for signed-out readers', () => {
	it('keeps GETs of catalogue routes without credentials', () => {
		expect(isSignedOutRead(event('/e/[accession=accession]/[[version=version]]'))).toBe(true);
		expect(isSignedOutRead(event('/api/v1/potentials'))).toBe(true);
		// Cookies other than the session (Auth.js's callback URL, say) do not make a reader.
		const other = { headers: { cookie: 'authjs.callback-url=x; theme=dark' } };
		expect(isSignedOutRead(event('/search', other))).toBe(true);
	});

	it('never keeps writes, other routes, sessions or Authorization headers', () => {
		expect(isSignedOutRead(event('/search', { method: 'POST' }))).toBe(false);
		expect(isSignedOutRead(event('/submissions'))).toBe(false);
		expect(isSignedOutRead(event('/account'))).toBe(false);
		expect(isSignedOutRead(event(null))).toBe(false);
		for (const cookie of [
			'authjs.session-token=abc',
			'a=1; __Secure-authjs.session-token=abc',
			'authjs.session-token.0=abc; authjs.session-token.1=def'
		]) {
			expect(isSignedOutRead(event('/search', { headers: { cookie } }))).toBe(false);
			expect(hasSessionCookie(new Request('http://h/', { headers: { cookie } }))).toBe(true);
		}
		const bearer = { headers: { authorization: 'Bearer t' } };
		expect(isSignedOutRead(event('/api/v1/potentials', bearer))).toBe(false);
	});
});

describe('If-None-Match (RFC 9110 §13.1.2, weak comparison)', () => {
	it('matches one tag, a list, weak forms and *', () => {
		expect(etagMatches('"abc"', '"abc"')).toBe(true);
		expect(etagMatches('"x", "abc"', '"abc"')).toBe(true);
		expect(etagMatches('W/"abc"', '"abc"')).toBe(true);
		expect(etagMatches('*', '"abc"')).toBe(true);
		expect(etagMatches('"abd"', '"abc"')).toBe(false);
		expect(etagMatches(null, '"abc"')).toBe(false);
		expect(etagMatches('', '"abc"')).toBe(false);
	});
});

describe('the next UTC midnight (citations carry the access date)', () => {
	it('is the start of the next UTC day, across month and year ends', () => {
		expect(new Date(nextUtcMidnight(new Date('2026-12-02T15:00:00Z'))).toISOString()).toBe(
			'2026-12-03T00:00:00.000Z'
		);
		expect(new Date(nextUtcMidnight(new Date('2026-12-31T23:59:59.999Z'))).toISOString()).toBe(
			'2027-01-01T00:00:00.000Z'
		);
		expect(new Date(nextUtcMidnight(new Date('2027-01-01T00:00:00.000Z'))).toISOString()).toBe(
			'2027-01-02T00:00:00.000Z'
		);
	});
});
