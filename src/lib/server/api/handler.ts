import type { RequestEvent } from '@sveltejs/kit';
import { EntryNotFoundError, InvalidEntryDataError } from '../catalogue/errors';
import { ForbiddenError, UnauthenticatedError } from '../auth/roles';
import {
	SubmissionAccessError,
	SubmissionInvalidError,
	SubmissionNotFoundError,
	SubmissionStateError
} from '../curation/errors';
import { CalcBusyError, CalcRateLimitedError, CalcTimeLimitError } from '../calc/errors';
import { apiError } from './respond';

/**
 * Wraps an API handler so that every failure leaves in the API's one error shape: domain
 * errors map to their codes here, anything unexpected is logged with an id and becomes a 500
 * that reveals nothing internal.
 */
export function apiHandler<E extends RequestEvent>(handler: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await handler(event);
		} catch (err) {
			if (err instanceof EntryNotFoundError) return apiError('not_found', err.message);
			if (err instanceof InvalidEntryDataError) {
				return apiError('bad_request', err.message, { [err.field]: [err.message] });
			}
			if (err instanceof UnauthenticatedError) return apiError('unauthorized', err.message);
			if (err instanceof ForbiddenError) return apiError('forbidden', err.message);
			if (err instanceof SubmissionInvalidError) {
				return apiError('bad_request', err.message, err.fields);
			}
			if (err instanceof SubmissionStateError) return apiError('conflict', err.message);
			if (err instanceof SubmissionAccessError) return apiError('forbidden', err.message);
			if (err instanceof SubmissionNotFoundError) return apiError('not_found', err.message);
			if (err instanceof CalcRateLimitedError || err instanceof CalcBusyError) {
				const code = err instanceof CalcBusyError ? 'unavailable' : 'too_many_requests';
				const response = apiError(code, err.message);
				response.headers.set('retry-after', String(err.retryAfterSeconds));
				return response;
			}
			if (err instanceof CalcTimeLimitError) return apiError('time_limit_exceeded', err.message);
			const errorId = crypto.randomUUID();
			console.error(`[api ${errorId}] ${event.request.method} ${event.url.pathname}`, err);
			return Response.json(
				{
					error: {
						code: 'internal_error',
						message: 'Internal error; quote the error id when reporting it.',
						errorId
					}
				},
				{ status: 500 }
			);
		}
	};
}
