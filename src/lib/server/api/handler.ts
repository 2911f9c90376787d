import type { RequestEvent } from '@sveltejs/kit';
import { DomainError } from '$lib/domainError';
import { toApiResponse } from '../http/failures';

/**
 * Wraps an API handler so that every failure leaves in the API's one error shape: a domain
 * error answers with its code (`toApiResponse`), anything unexpected is logged with an id and
 * becomes a 500 that reveals nothing internal.
 */
export function apiHandler<E extends RequestEvent>(handler: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await handler(event);
		} catch (err) {
			if (err instanceof DomainError) return toApiResponse(err);
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
