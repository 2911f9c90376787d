import { describe, expect, it } from 'vitest';
import { formatField } from '$lib/catalogue/fields';
import {
	DISTANCE_METHODS,
	DISTANCE_METHOD_LABELS,
	POTENTIAL_METHODS,
	POTENTIAL_METHOD_LABELS,
	SPIN_METHODS,
	SPIN_METHOD_LABELS
} from '$lib/schemas/vocabulary';

describe('formatField', () => {
	it('can label a method without knowing its kind: an identifier two vocabularies share has one label', () => {
		const labels = new Map<string, string[]>();
		for (const [id, label] of [
			...Object.entries(POTENTIAL_METHOD_LABELS),
			...Object.entries(SPIN_METHOD_LABELS),
			...Object.entries(DISTANCE_METHOD_LABELS)
		])
			labels.set(id, [...(labels.get(id) ?? []), label]);
		for (const [id, all] of labels) expect(new Set(all).size, id).toBe(1);
		// 'computed' is the one shared identifier today; the check above is what matters.
		expect([...labels.values()].some((l) => l.length > 1)).toBe(true);
	});

	it('labels every method of every kind (the compare page passes no kind)', () => {
		for (const m of POTENTIAL_METHODS)
			expect(formatField('method', m)).toBe(POTENTIAL_METHOD_LABELS[m]);
		for (const m of SPIN_METHODS) expect(formatField('method', m)).toBe(SPIN_METHOD_LABELS[m]);
		for (const m of DISTANCE_METHODS)
			expect(formatField('method', m)).toBe(DISTANCE_METHOD_LABELS[m]);
	});

	it('shows an unknown method as written, and nothing as a dash', () => {
		expect(formatField('method', 'hand_waving')).toBe('hand_waving');
		expect(formatField('method', null)).toBe('—');
	});
});
