import { describe, expect, it } from 'vitest';
import { coupleKey, coupleMatches, parseQuery, searchWords } from '$lib/catalogue/searchTerms';

/* The one reading of search text: each spelling and what it is read as (the oracle is the trade's usage). */

const words = (q: string) =>
	parseQuery(q).flatMap((t) => (t.type === 'word' ? [t.word] : [`<${t.type}>`]));

describe('searchWords / parseQuery', () => {
	it.each([
		['4Fe4S', ['4fe4s']],
		['Fe4S4', ['4fe4s']],
		['[4Fe-4S]', ['4fe4s']],
		['4Fe-4S', ['4fe4s']],
		['[Fe4S4]', ['4fe4s']],
		['2[4Fe-4S] ferredoxin', ['2', '4fe4s', 'ferredoxin']],
		['2Fe2S', ['2fe2s']],
		['[3Fe–4S]', ['3fe4s']],
		['HiPIP', ['hipip']],
		['high-potential iron-sulfur protein', ['hipip']],
		['haem', ['heme']],
		['UQ', ['ubiquinone']],
		['CoQ', ['ubiquinone']],
		['MK', ['menaquinone']],
		['Céline', ['celine']]
	])('%s → %j', (q, expected) => {
		expect(words(q)).toEqual(expected);
	});

	it('reads two-word cofactor names as one word beside their head word', () => {
		expect(words('heme c')).toEqual(['heme_c', 'heme']);
		expect(words('haem-c')).toEqual(['heme_c', 'heme']);
		expect(words('c-type heme')).toEqual(['heme_c', 'heme']);
		expect(words('type-1 Cu')).toEqual(['type1_cu', 'cu']);
		expect(searchWords('heme c')).toEqual(searchWords('Heme C'));
	});

	it('makes only the last plain word a prefix, and lets only plain long words be fuzzy', () => {
		const terms = parseQuery('ferredoxin hydrog');
		expect(terms).toEqual([
			{ type: 'word', word: 'ferredoxin', prefix: false, fuzzy: true },
			{ type: 'word', word: 'hydrog', prefix: true, fuzzy: true }
		]);
		expect(parseQuery('4Fe4S')).toEqual([
			{ type: 'word', word: '4fe4s', prefix: true, fuzzy: false }
		]);
		expect(parseQuery('heme c').find((t) => t.type === 'word' && t.word === 'heme_c')).toEqual({
			type: 'word',
			word: 'heme_c',
			prefix: false,
			fuzzy: false
		});
	});

	it('reads couples and DOIs as whole terms, and other slashes as words', () => {
		expect(words('[4Fe-4S]2+/1+')).toEqual(['<couple>']);
		expect(words('2+/1+')).toEqual(['<couple>']);
		expect(words('ox/hq')).toEqual(['<couple>']);
		expect(words('Mo/W-pterin')).toEqual(['mo', 'w', 'pterin']);
		expect(parseQuery('doi:10.5555/ABC.1')).toEqual([{ type: 'doi', doi: '10.5555/abc.1' }]);
	});
});

describe('coupleKey / coupleMatches', () => {
	const stored = coupleKey('[4Fe-4S]2+/1+')!;
	it.each(['[4Fe-4S]2+/1+', '[4Fe4S]2+/+', '4Fe-4S 2+/1+', 'Fe4S4 +2/+1', '[4Fe–4S]²⁺/¹⁺'])(
		'%s is the [4Fe-4S]2+/1+ couple',
		(q) => expect(coupleMatches(coupleKey(q)!, stored)).toBe(true)
	);
	it('a bare charge pair matches every couple with those charges, an element only its own', () => {
		expect(coupleMatches(coupleKey('2+/1+')!, stored)).toBe(true);
		expect(coupleMatches(coupleKey('2+/1+')!, coupleKey('Cu2+/Cu+')!)).toBe(true);
		expect(coupleMatches(coupleKey('[2Fe-2S]2+/1+')!, stored)).toBe(false);
		expect(coupleMatches(coupleKey('1+/0')!, stored)).toBe(false);
		expect(coupleMatches(coupleKey('[3Fe-4S]0/2-')!, coupleKey('[3Fe-4S]0/2−')!)).toBe(true);
	});
});
