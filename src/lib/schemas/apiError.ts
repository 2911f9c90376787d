import { z } from 'zod';

/* The API's one error shape: `{ error: { code, message, fields? } }`, codes a closed set. */
export const API_ERROR_CODES = {
	bad_request: 400,
	unauthorized: 401,
	forbidden: 403,
	not_found: 404,
	method_not_allowed: 405,
	conflict: 409,
	/** A body sent without Content-Length (its size must be known before it is read). */
	length_required: 411,
	payload_too_large: 413,
	/** A file of a type the registry does not accept (an attachment's type is read from its bytes). */
	unsupported_media_type: 415,
	/** A calculation stopped at its time limit (CALC_TIME_LIMIT_MS). */
	time_limit_exceeded: 422,
	/**
	 * A file of an accepted type that cannot be read (a damaged image, an unplottable numbers
	 * file). Listed after time_limit_exceeded, which stays the code of a bare 422.
	 */
	unprocessable_content: 422,
	/** Too many calculations from one address without an account; see Retry-After. */
	too_many_requests: 429,
	internal_error: 500,
	/** Every calculation worker is busy and the queue is full; see Retry-After. */
	unavailable: 503
} as const;
export type ApiErrorCode = keyof typeof API_ERROR_CODES;

const codes = Object.keys(API_ERROR_CODES) as [ApiErrorCode, ...ApiErrorCode[]];

/** Field name (a query parameter, or a dotted path into a JSON body) → what is wrong with it. */
export const fieldErrorsSchema = z.record(z.string(), z.array(z.string()));

/** The body of every API error; the OpenAPI document describes errors with this schema. */
export const apiErrorBodySchema = z.strictObject({
	error: z.strictObject({
		code: z
			.enum(codes)
			.describe(
				`One of a closed list, each with its HTTP status: ${codes.map((c) => `${c} (${API_ERROR_CODES[c]})`).join(', ')}.`
			),
		message: z.string().describe('What went wrong, for the person who caused it.'),
		fields: fieldErrorsSchema
			.optional()
			.describe('Errors per parameter or body field (400, and 413 for an upload).'),
		errorId: z.string().optional().describe('On a 500 only: quote it when reporting the fault.')
	})
});
export type ApiErrorBody = z.infer<typeof apiErrorBodySchema>;
