import { describe, expect, it } from 'vitest';
import { citeRecord, plainCitations } from '$lib/catalogue/citation';
import { FIELD_LABELS, formatField } from '$lib/catalogue/fields';
import {
	formatAngstrom,
	formatEv,
	formatGValues,
	formatKelvin,
	formatMv,
	formatNumber,
	formatPercent,
	formatPh,
	formatRate,
	formatRateControl,
	formatScientific,
	formatUncertaintyMv,
	typesetSegments,
	typesetText,
	unicodeMinusInText
} from '$lib/format';
import { hopRatePath } from '../../src/routes/e/[accession=accession]/[[version=version]]/hopRateLink';
import { POTENTIAL } from '../support/citations';

/*
 * Display precision and typography (issue 14, §1): one rule per quantity, the Unicode minus
 * (U+2212) for negative numbers, no sign on a value that rounds to zero, and charges typeset in
 * running text. Oracle: the rules written in src/lib/format.ts, worked by hand per case.
 */
const MINUS = '\u2212';
const NBSP = '\u00a0';

describe('one precision rule per quantity', () => {
	it.each([
		[formatMv(-412.94), `${MINUS}413${NBSP}mV`],
		[formatMv(-0.4), `0${NBSP}mV`],
		[formatUncertaintyMv(10), `±${NBSP}10${NBSP}mV`],
		[formatAngstrom(8), `8.0${NBSP}Å`],
		[formatAngstrom(12.649), `12.6${NBSP}Å`],
		[formatAngstrom(-0.04), `0.0${NBSP}Å`],
		[formatPh(7), `pH${NBSP}7.0`],
		[formatPh(7.5), `pH${NBSP}7.5`],
		[formatPh(7.254), `pH${NBSP}7.25`],
		[formatKelvin(298.15), `298.15${NBSP}K`],
		[formatKelvin(300), `300${NBSP}K`],
		[formatGValues([2.05, 1.9]), '2.050, 1.900'],
		[formatEv(-0.0123), `${MINUS}0.012${NBSP}eV`],
		[formatEv(-0.0001), `0.000${NBSP}eV`],
		[formatRateControl(-0.125), `${MINUS}0.13`],
		[formatRateControl(-0.001), '0.00'],
		[formatPercent(0.125), `12.5${NBSP}%`],
		[formatNumber(-0.6249), `${MINUS}0.6249`]
	])('%s', (shown, expected) => {
		expect(shown).toBe(expected);
	});

	it('writes rates with three significant figures and a power of ten, never "e+"', () => {
		expect(formatScientific(123456)).toBe(`1.23${NBSP}×${NBSP}10⁵`);
		expect(formatScientific(0.000123)).toBe(`1.23${NBSP}×${NBSP}10⁻⁴`);
		expect(formatScientific(42)).toBe('42.0');
		expect(formatRate(1.5e9)).toBe(`1.50${NBSP}×${NBSP}10⁹${NBSP}s⁻¹`);
		// A rate that underflows: its power of ten from the logarithm the kinetics gives.
		expect(formatRate(0, -412.4)).toBe(`<${NBSP}10⁻³⁰⁰${NBSP}s⁻¹ (about 10⁻⁴¹²)`);
	});

	it('formats stored fields with the same rules and the Unicode minus', () => {
		expect(formatField('reportedValue', -0.6249)).toBe(`${MINUS}0.6249`);
		expect(formatField('emMvShe', -412.9)).toBe(`${MINUS}413${NBSP}mV vs SHE`);
		expect(formatField('ph', 7)).toBe('7.0');
		expect(formatField('coordinatesA', { x: -1.5, y: 2, z: 0 })).toBe(`(${MINUS}1.5, 2, 0)`);
		expect(formatField('edgeToEdgeA', 9)).toBe(`9.0${NBSP}Å`);
	});
});

describe('the trade’s words (§7)', () => {
	it('names the converted Em, the cofactor type and the redox state', () => {
		expect(FIELD_LABELS.emMvShe).toBe('Em vs SHE (converted)');
		expect(FIELD_LABELS.cofactorKind).toBe('Cofactor type');
		expect(FIELD_LABELS.oxidationLevel).toBe('Redox state');
		expect(Object.values(FIELD_LABELS)).not.toContain('Kind');
	});
});

describe('typesetText', () => {
	it.each([
		['Em of [4Fe-4S]2+/1+, centre Cluster A', 'Em of [4Fe-4S]²⁺/¹⁺, centre Cluster A'],
		['Cu2+/Cu+ of T1 Cu (CupA)', 'Cu²⁺/Cu⁺ of T1 Cu (CupA)'],
		[
			'S of [4Fe-4S]1+ in FdxT 2[4Fe-4S] ferredoxin',
			'S of [4Fe-4S]¹⁺ in FdxT 2[4Fe-4S] ferredoxin'
		],
		['spin of (Fe3+)', 'spin of (Fe³⁺)'],
		['ox/hq of FMN', 'ox/hq of FMN'],
		['RoxA–H NADH:quinone oxidoreductase', 'RoxA–H NADH:quinone oxidoreductase']
	])('%s → %s', (typed, shown) => {
		expect(typesetText(typed)).toBe(shown);
	});

	it('marks the typeset tokens so that a page keeps each on one line', () => {
		expect(typesetSegments('Em of [4Fe-4S]2+/1+, centre C1')).toEqual([
			{ text: 'Em of ', typeset: false },
			{ text: '[4Fe-4S]²⁺/¹⁺', typeset: true },
			{ text: ', centre C1', typeset: false }
		]);
	});
});

describe('unicodeMinusInText', () => {
	it('replaces a hyphen before a number, not inside names or ranges', () => {
		expect(unicodeMinusInText('Em -250 mV (range -600 to -100 mV); [2Fe-2S] at 0-70 °C')).toBe(
			`Em ${MINUS}250 mV (range ${MINUS}600 to ${MINUS}100 mV); [2Fe-2S] at 0-70 °C`
		);
		expect(unicodeMinusInText('-.5 V')).toBe(`${MINUS}.5 V`);
	});
});

describe('plainCitations', () => {
	it('gives this version and the original apart, as the plain-text citation joins them', () => {
		const parts = plainCitations(POTENTIAL, '2026-03-02');
		expect(parts.record).toContain('version 2');
		expect(parts.record).toContain('(accessed 2026-03-02)');
		expect(parts.original).toContain('https://doi.org/10.5555/demo_1');
		// The stored plain text (frozen, in every citation) is exactly the two joined.
		expect(citeRecord(POTENTIAL, '2026-03-02').text).toBe(
			`${parts.record}\nCite the original measurement: ${parts.original}`
		);
		expect(plainCitations({ ...POTENTIAL, original: null }, null).original).toBeNull();
	});
});

describe('hopRatePath', () => {
	it('pre-fills the calculator with the pair of centres', () => {
		expect(hopRatePath('HL000010', 'HL000011')).toBe(
			'/calc/hop-rate?donor=HL000010&acceptor=HL000011'
		);
	});
});
