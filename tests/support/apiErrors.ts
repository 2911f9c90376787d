import { expect } from 'vitest';
import { z } from 'zod';
import { API_ERROR_CODES, type ApiErrorCode } from '$lib/schemas/apiError';

/**
 * The API's one error shape, written out as the oracle for HTTP tests (DEVELOPERS.md, "Add an
 * API route"): `{ error: { code, message, fields?, errorId? } }` and nothing else, as JSON, with
 * no cookie.
 */
const errorShape = z.strictObject({
	error: z.strictObject({
		code: z.enum(Object.keys(API_ERROR_CODES) as [ApiErrorCode, ...ApiErrorCode[]]),
		message: z.string().min(1),
		fields: z.record(z.string(), z.array(z.string())).optional(),
		errorId: z.string().optional()
	})
});

export type ApiErrorSeen = z.infer<typeof errorShape>['error'];

/** Checks status, shape and code of an API error answer; returns its error object. */
export async function expectApiError(
	res: Response,
	status: number,
	code: ApiErrorCode
): Promise<ApiErrorSeen> {
	const body: unknown = await res.json();
	expect({ status: res.status, body }).toMatchObject({ status, body: { error: { code } } });
	expect(res.headers.get('content-type')).toMatch(/^application\/json/);
	expect(res.headers.get('set-cookie')).toBeNull();
	return errorShape.parse(body).error;
}
