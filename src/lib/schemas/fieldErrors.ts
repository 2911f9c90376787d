import type { z } from 'zod';
import type { FieldErrors } from './searchParams';

/**
 * Field errors from a zod error, keyed by the issue's dotted path: the one way issues become
 * the `{ field: [messages] }` that forms show beside their fields and the API returns as
 * `fields`.
 * @param options.prefix put before every key (`visibility.` for a nested API object).
 * @param options.root the key of an issue about the whole value (an empty path); default `_`.
 */
export function fieldErrors(
	error: z.ZodError,
	options: { prefix?: string; root?: string } = {}
): FieldErrors {
	const { prefix = '', root = '_' } = options;
	const fields: FieldErrors = {};
	for (const issue of error.issues) {
		const key = prefix + (issue.path.length ? issue.path.join('.') : root);
		(fields[key] ??= []).push(issue.message);
	}
	return fields;
}

/** Adds `more` to `into`, keeping the messages already there first. */
export function addFieldErrors(into: FieldErrors, more: FieldErrors): FieldErrors {
	for (const [key, messages] of Object.entries(more)) (into[key] ??= []).push(...messages);
	return into;
}
