import { z } from 'zod';
import type { fieldErrorsSchema } from './apiError';
import { NOT_A_DECIMAL, readDecimal } from './decimal';

/** Field errors as the API and forms report them: field name → messages. */
export type FieldErrors = z.infer<typeof fieldErrorsSchema>;

export type ParamsResult<T> = { ok: true; data: T } | { ok: false; fields: FieldErrors };

/**
 * Reads URL query parameters into a zod object schema. Keys listed in `listKeys` may repeat or
 * hold comma-separated values and arrive as arrays; every other key must appear at most once.
 * Empty values count as absent. Unknown keys are errors, so a typo never silently widens a query.
 */
export function parseSearchParams<S extends z.ZodObject>(
	schema: S,
	params: URLSearchParams,
	listKeys: readonly string[] = []
): ParamsResult<z.infer<S>> {
	const record: Record<string, string | string[]> = {};
	const fields: FieldErrors = {};
	const known = new Set(Object.keys(schema.shape));
	for (const key of new Set(params.keys())) {
		if (!known.has(key)) {
			fields[key] = [`unknown parameter; expected one of ${[...known].join(', ')}`];
			continue;
		}
		const values = params
			.getAll(key)
			.flatMap((v) => (listKeys.includes(key) ? v.split(',') : [v]))
			.map((v) => v.trim())
			.filter((v) => v !== '');
		if (values.length === 0) continue;
		if (listKeys.includes(key)) record[key] = values;
		else if (values.length > 1) fields[key] = ['given more than once; expected a single value'];
		else record[key] = values[0] as string;
	}
	const parsed = schema.safeParse(record);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = String(issue.path[0] ?? '_');
			const message = key in record || key === '_' ? issue.message : `required: ${issue.message}`;
			(fields[key] ??= []).push(message);
		}
	}
	if (Object.keys(fields).length > 0 || !parsed.success) return { ok: false, fields };
	return { ok: true, data: parsed.data };
}

/*
 * Bounds are zod's own checks (min, max, int) rather than refinements, so that the JSON Schema
 * made from these schemas (the OpenAPI document, src/lib/server/openapi) states them too.
 *
 * Text is read by `readDecimal`, the one reader of typed numbers (decimal.ts): a Unicode minus,
 * a decimal comma and digit-group spaces are read; hexadecimal ("0x10" is not 16), binary and
 * octal prefixes, "Infinity" and out-of-range exponents ("1e400") are not numbers here. (zod's
 * coercion is Number(), which reads all of those.) Text the reader refuses stays text, so the
 * number schema refuses it with the field's message. The preprocessing step is invisible to
 * the JSON Schema of requests: zod describes a preprocessed value by its target schema.
 */

function readQueryValue(value: unknown): unknown {
	return typeof value === 'string' ? (readDecimal(value) ?? value) : value;
}

/**
 * A number from a query string, within bounds, with a message that names them. `why` explains
 * a bound that is not obvious (it is added to the message and should name its source).
 */
export function queryNumber(min: number, max: number, unit = '', why?: string) {
	const bounds = `from ${min}${unit} to ${max}${unit}`;
	const message = `expected a number ${bounds}${why ? ` (${why})` : ''}`;
	return z.preprocess(
		readQueryValue,
		z
			.number({ error: `${NOT_A_DECIMAL}, ${bounds}` })
			.min(min, message)
			.max(max, message)
	);
}

/** A whole number from a query string, within bounds. */
export function queryInteger(min: number, max: number) {
	const message = `expected a whole number from ${min} to ${max}`;
	// A fraction is named once, not again by a bound it also misses.
	return z.preprocess(
		readQueryValue,
		z.number({ error: message }).int({ message, abort: true }).min(min, message).max(max, message)
	);
}
