import { fail } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors } from '$lib/schemas/fieldErrors';

/**
 * Parses a form action's body with a schema: the data, or a 400 `fail` carrying the values sent
 * and the errors per field, ready to return from the action.
 */
export async function parseForm<S extends z.ZodType>(request: Request, schema: S) {
	const values = Object.fromEntries(await request.formData());
	const parsed = schema.safeParse(values);
	if (!parsed.success) {
		return {
			ok: false as const,
			failure: fail(400, { values: stringValues(values), errors: fieldErrors(parsed.error) })
		};
	}
	return { ok: true as const, data: parsed.data as z.infer<S>, values: stringValues(values) };
}

function stringValues(values: Record<string, FormDataEntryValue>): Record<string, string> {
	return Object.fromEntries(
		Object.entries(values).map(([k, v]) => [k, typeof v === 'string' ? v : v.name])
	);
}
