import { fail } from '@sveltejs/kit';
import { TOO_MANY_MAIL_REQUESTS, takeMailRequest } from '../auth/rateLimit';

/** takeMailRequest for a form action: the 429 answer when refused, else null. */
export function refuseTooManyMailRequests(
	client: string,
	recipient: string,
	values: Record<string, string>
) {
	if (takeMailRequest(client, recipient) === 0) return null;
	return fail(429, { values, errors: { form: [TOO_MANY_MAIL_REQUESTS] } });
}
