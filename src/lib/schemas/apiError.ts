import type { FieldErrors } from './searchParams';

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
	/** A calculation stopped at its time limit (CALC_TIME_LIMIT_MS). */
	time_limit_exceeded: 422,
	/** Too many calculations from one address without an account; see Retry-After. */
	too_many_requests: 429,
	internal_error: 500,
	/** Every calculation worker is busy and the queue is full; see Retry-After. */
	unavailable: 503
} as const;
export type ApiErrorCode = keyof typeof API_ERROR_CODES;

export interface ApiErrorBody {
	error: { code: ApiErrorCode; message: string; fields?: FieldErrors; errorId?: string };
}
