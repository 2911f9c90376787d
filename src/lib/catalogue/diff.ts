import type { z } from 'zod';
import type { fieldChangeSchema } from '$lib/schemas/curationResponses';

/** One field that differs between two versions of an entry. */
export type FieldChange = z.infer<typeof fieldChangeSchema>;

function same(a: unknown, b: unknown): boolean {
	return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * Field-by-field differences between two versions' data, in the order the fields appear
 * (fields only one side has count as changed from or to null).
 */
export function diffEntryData(
	before: Record<string, unknown>,
	after: Record<string, unknown>
): FieldChange[] {
	const fields = [...new Set([...Object.keys(before), ...Object.keys(after)])];
	return fields
		.filter((f) => !same(before[f] ?? null, after[f] ?? null))
		.map((field) => ({ field, before: before[field] ?? null, after: after[field] ?? null }));
}
