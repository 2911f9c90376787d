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

// The table of kinds is the one list of them: identifiers, labels and upload kinds come from the
// kinds' modules, so that a new kind is its two modules and a migration.

describe('the table of kinds', () => {
	it('lists each kind once, labelled by its module', () => {
		expect(ENTRY_KINDS).toEqual([
			'protein',
			'centre',
			'potential',
			'spin_record',
			'distance',
			'source'
		]);
		for (const kind of ENTRY_KINDS) expect(ENTRY_KIND_LABELS[kind]).toBe(KINDS[kind].label);
	});

	it('makes the kinds with upload rules the upload kinds, and no other', () => {
		expect(UPLOAD_KINDS).toEqual(
			ENTRY_KINDS.filter((k) => 'upload' in KINDS[k] && KINDS[k].upload)
		);
		expect(UPLOAD_KINDS).toEqual(['centre', 'potential', 'spin_record', 'distance']);
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
		expect(fieldLabel('potential', 'emMvShe')).toBe('Em (normalised)');
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
});
