import type { ApiErrorCode } from '$lib/schemas/apiError';
import type { FieldErrors } from '$lib/schemas/searchParams';

/**
 * The base of every expected failure a service (or shared code) throws: it carries its code from
 * the API's closed list (`$lib/schemas/apiError.ts`, which also fixes its HTTP status), a message
 * fit for the person who caused it, and optionally errors per field and a Retry-After. Routes
 * never map subclasses one by one: `toApiResponse` and `toFormFailure`
 * (`$lib/server/http/failures.ts`) read the code. Anything that is not a DomainError is a bug
 * and becomes a logged 500.
 *
 * Client-safe (no server imports), because `CsvLimitError` is thrown in the browser's preview
 * worker as well.
 */
export class DomainError extends Error {
	readonly fields: FieldErrors | undefined;
	readonly retryAfterSeconds: number | undefined;

	constructor(
		readonly code: ApiErrorCode,
		message: string,
		options: { fields?: FieldErrors; retryAfterSeconds?: number } = {}
	) {
		super(message);
		this.name = 'DomainError';
		this.fields = options.fields;
		this.retryAfterSeconds = options.retryAfterSeconds;
	}
}
