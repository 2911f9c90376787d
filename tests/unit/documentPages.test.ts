import { describe, expect, it } from 'vitest';
import { isDocumentPath } from '$lib/documentPages';

describe('isDocumentPath', () => {
	it('takes an entry page at its latest or a given version', () => {
		expect(isDocumentPath('/e/HL000007')).toBe(true);
		expect(isDocumentPath('/e/HL000007/v1')).toBe(true);
		expect(isDocumentPath('/e/HL1234567/v12')).toBe(true);
	});
	it('leaves every other page to the router', () => {
		for (const path of [
			'/',
			'/search',
			'/e/HL000007/compare',
			'/e/HL000007/cite.bib',
			'/e/HL000007/v1/cite.ris',
			'/e/HL000007/v0',
			'/e/HL000007/',
			'/e/HL7',
			'/e/HL000007/v1/x',
			'/api/v1/entries/HL000007'
		])
			expect(isDocumentPath(path), path).toBe(false);
	});
});
