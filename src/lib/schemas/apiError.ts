import type { FieldErrors } from './searchParams';

/** The API's one error shape: `{ error: { code, message, fields? } }`, codes a closed set. */
export const API_ERROR_CODES = {
	bad_request: 400,
	unauthorized: 401,
	forbidden: 403,
	not_found: 404,
	method_not_allowed: 405,
	conflict: 409,
	payload_too_large: 413,
	internal_error: 500
} as const;
export type ApiErrorCode = keyof typeof API_ERROR_CODES;

export interface ApiErrorBody {
	error: { code: ApiErrorCode; message: string; fields?: FieldErrors; errorId?: string };
}
