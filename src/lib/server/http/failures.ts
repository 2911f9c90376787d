import { error, fail, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import { DomainError } from '$lib/domainError';
import { API_ERROR_CODES } from '$lib/schemas/apiError';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { apiError } from '../api/respond';

/**
 * The one path from a domain failure to an HTTP answer. Services throw `DomainError`s
 * (`$lib/domainError.ts`) carrying a code from the API's list; the status is that code's
 * (`API_ERROR_CODES`), in the API and on pages alike. Anything else is re-thrown: a bug, answered
 * as a logged 500 with an error id (`apiHandler`, `handleError` in hooks.server.ts).
 */

/** The API's error body and status for a domain failure, with Retry-After where it has one. */
export function toApiResponse(e: DomainError): Response {
	const response = apiError(e.code, e.message, e.fields);
	if (e.retryAfterSeconds !== undefined) {
		response.headers.set('retry-after', String(e.retryAfterSeconds));
	}
	return response;
}

/**
 * A form action's answer to a failure, to be returned from the action: errors about the input
 * (400, 413) beside their fields (or the whole form when the error names none); refusals of the
 * moment (409, 422, 429, 503) as a message about the whole form, with Retry-After where it
 * applies; 401, 403 and 404 thrown as SvelteKit errors, since the page itself is closed then.
 * `values` (the strings posted) go back so that the form keeps what was typed.
 * @throws the error itself when it is not a DomainError.
 */
export function toFormFailure(
	e: unknown,
	event: Pick<RequestEvent, 'setHeaders'>
): ActionFailure<{ errors: FieldErrors }>;
export function toFormFailure<V extends Record<string, string>>(
	e: unknown,
	event: Pick<RequestEvent, 'setHeaders'>,
	values: V
): ActionFailure<{ values: V; errors: FieldErrors }>;
export function toFormFailure<V extends Record<string, string>>(
	e: unknown,
	event: Pick<RequestEvent, 'setHeaders'>,
	values?: V
) {
	if (!(e instanceof DomainError)) throw e;
	const status = API_ERROR_CODES[e.code];
	switch (e.code) {
		case 'bad_request':
		case 'length_required':
		case 'payload_too_large':
		case 'unsupported_media_type':
		case 'unprocessable_content':
			return fail(status, withValues(values, e.fields ?? { form: [e.message] }));
		case 'conflict':
		case 'time_limit_exceeded':
		case 'too_many_requests':
		case 'unavailable':
			if (e.retryAfterSeconds !== undefined) {
				event.setHeaders({ 'retry-after': String(e.retryAfterSeconds) });
			}
			return fail(status, withValues(values, { form: [e.message] }));
		case 'unauthorized':
		case 'forbidden':
		case 'not_found':
		case 'method_not_allowed':
		case 'internal_error':
			error(status, { message: e.message });
	}
}

function withValues<V>(values: V | undefined, errors: FieldErrors) {
	return values === undefined ? { errors } : { values, errors };
}

/**
 * For loads: what `work` gives, or a 404 page saying `message` when it fails with a not-found
 * domain error (the page's own wording, which may differ from the service's). Other failures
 * pass through.
 */
export async function orNotFound<T>(work: Promise<T>, message: string): Promise<T> {
	try {
		return await work;
	} catch (e) {
		if (e instanceof DomainError && e.code === 'not_found') error(404, { message });
		throw e;
	}
}

/** A page's 400 for bad query parameters: every field and its messages in one line. */
export function queryError(fields: FieldErrors): never {
	error(400, {
		message: Object.entries(fields)
			.map(([field, messages]) => `${field}: ${messages.join('; ')}`)
			.join(' · ')
	});
}
