import { describe, expect, it } from 'vitest';
import { formatField } from '$lib/catalogue/fields';
import {
	ENTRY_KINDS,
	ENTRY_KIND_LABELS,
	KINDS,
	UPLOAD_KINDS,
	UPLOAD_KIND_NOUNS,
	fieldLabel,
	formatKindField,
	referencesOf
} from '$lib/kinds';
import { SPIN_METHOD_LABELS } from '$lib/schemas/vocabulary';

// The table of kinds is the one list of them: identifiers, labels and upload kinds come from the
// kinds' modules, so that a new kind is its two modules and a migration.

describe('the table of kinds', () => {
	it('lists each kind once, labelled by its module', () => {
		// The kinds of today, in dependency order; a new kind is appended by its own line in KINDS.
		expect(ENTRY_KINDS.slice(0, 6)).toEqual([
			'protein',
			'centre',
			'potential',
			'spin_record',
			'distance',
			'source'
		]);
		expect(new Set(ENTRY_KINDS).size).toBe(ENTRY_KINDS.length);
		for (const kind of ENTRY_KINDS) expect(ENTRY_KIND_LABELS[kind]).toBe(KINDS[kind].label);
	});

	it('makes the kinds with upload rules the upload kinds, and no other', () => {
		for (const kind of ENTRY_KINDS)
			expect(UPLOAD_KINDS.includes(kind as never), kind).toBe(
				'upload' in KINDS[kind] && KINDS[kind].upload !== undefined
			);
		expect(UPLOAD_KINDS).toEqual(
			expect.arrayContaining(['centre', 'potential', 'spin_record', 'distance'])
		);
		expect(UPLOAD_KINDS).not.toContain('protein');
		expect(UPLOAD_KIND_NOUNS.spin_record).toBe('spin records');
	});

	it('has every reference name a kind, and every listed field be a field of the kind or derived', () => {
		for (const kind of ENTRY_KINDS) {
			for (const target of Object.values(referencesOf(kind))) expect(ENTRY_KINDS).toContain(target);
			const names = KINDS[kind].formFields.map((f) => f.name);
			for (const f of KINDS[kind].listFields)
				expect(names.includes(f) || f === 'emMvShe', `${kind}.${f}`).toBe(true);
		}
	});
});

describe('fields named through their kind', () => {
	it("takes the kind's own label first, then the shared one, then the field's name", () => {
		expect(fieldLabel('distance', 'edgeToEdgeA')).toBe('Edge-to-edge distance');
		// Not a form field (computed on normalising), so named by the shared table.
		expect(fieldLabel('potential', 'emMvShe')).toBe('Em vs SHE (converted)');
		expect(fieldLabel('potential', 'somethingNew')).toBe('somethingNew');
	});

	it("writes a field the shared formatter does not know with the unit its kind's form gives it", () => {
		expect(formatField('lambdaEv', 0.7, 'eV')).toBe('0.7 eV');
		expect(formatField('lambdaEv', null, 'eV')).toBe('—');
		// Known fields keep their own formatting (no unit written twice).
		expect(formatKindField('distance', 'edgeToEdgeA', 9.5)).toBe(formatField('edgeToEdgeA', 9.5));
		expect(formatKindField('distance', 'edgeToEdgeA', 9.5)).not.toMatch(/Å.*Å/);
		expect(formatKindField('potential', 'temperatureK', 298.15)).not.toMatch(/K.*K/);
	});

	it('writes a choice by the label its form gives it', () => {
		expect(formatKindField('spin_record', 'method', 'cw_epr_x')).toBe(SPIN_METHOD_LABELS.cw_epr_x);
		expect(formatKindField('source', 'sourceKind', 'dataset')).toBe('unpublished dataset');
		// A value outside the choices (an older vocabulary) is still shown, as the shared formatter would.
		expect(formatKindField('spin_record', 'method', 'retired_method')).toBe('retired_method');
	});
});
