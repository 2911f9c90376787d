import { describe, expect, it } from 'vitest';
import { orcidInputSchema } from '$lib/schemas/orcid';
import { isValidOrcid, orcidCheckCharacter } from '$lib/schemas/orcidId';

/*
 * Oracle: ORCID's documentation, "Structure of the ORCID Identifier"
 * (https://support.orcid.org/hc/en-us/articles/360006897674): the last character is an
 * ISO/IEC 7064:2003 MOD 11-2 check character over the first fifteen digits, "X" standing for 10.
 * Its worked examples: 0000-0002-1825-0097 (check 7) and 0000-0002-1694-233X (check X).
 */
describe('ORCID check character (ISO 7064 MOD 11-2)', () => {
	it.each([
		['000000021825009', '7'],
		['000000021694233', 'X'],
		['000000015109370', '0']
	])('%s → %s', (base, check) => expect(orcidCheckCharacter(base)).toBe(check));
	it('refuses anything but fifteen digits', () =>
		expect(() => orcidCheckCharacter('00000002182500')).toThrow(TypeError));
	it('a changed digit or swapped neighbours fail the check', () => {
		expect(isValidOrcid('0000-0002-1825-0097')).toBe(true);
		expect(isValidOrcid('0000-0002-1825-0098')).toBe(false);
		expect(isValidOrcid('0000-0002-1852-0097')).toBe(false);
	});
});

describe('the ORCID iD a person types', () => {
	it.each([
		['0000-0002-1825-0097', '0000-0002-1825-0097'],
		['https://orcid.org/0000-0002-1825-0097', '0000-0002-1825-0097'],
		['orcid.org/0000-0002-1694-233x', '0000-0002-1694-233X'],
		['0000 0002 1825 0097', '0000-0002-1825-0097'],
		['0000000218250097', '0000-0002-1825-0097'],
		['', null],
		['   ', null]
	])('%j is read as %j', (typed, id) => expect(orcidInputSchema.parse(typed)).toBe(id));

	it('a wrong check character is named with the one expected', () => {
		const result = orcidInputSchema.safeParse('0000-0002-1825-0098');
		expect(result.success).toBe(false);
		expect(result.error?.issues[0]?.message).toBe(
			'0000-0002-1825-0098 is not an ORCID iD: its last character should be 7 (check for a typing error)'
		);
	});
	it.each([
		'0000-0002-1825',
		'0000-0002-1825-00977',
		'X000-0002-1825-0097',
		'https://example.org/0000-0002-1825-0097'
	])('%j is refused for its form', (typed) => {
		const result = orcidInputSchema.safeParse(typed);
		expect(result.error?.issues[0]?.message).toMatch(/^an ORCID iD is sixteen characters/);
	});
});
