import type { z } from 'zod';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import { apiError } from './respond';

/** Reads and validates a JSON request body; a Response (400) when it is not what the schema wants. */
export async function parseJsonBody<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ ok: true; data: z.infer<S> } | { ok: false; response: Response }> {
	if (!(request.headers.get('content-type') ?? '').includes('application/json')) {
		return {
			ok: false,
			response: apiError('bad_request', 'Send the body as JSON (Content-Type: application/json).')
		};
	}
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		return { ok: false, response: apiError('bad_request', 'The body is not valid JSON.') };
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) {
		const fields = fieldErrors(parsed.error);
		return {
			ok: false,
			response: apiError(
				'bad_request',
				`Invalid field(s): ${Object.keys(fields).join(', ')}`,
				fields
			)
		};
	}
	return { ok: true, data: parsed.data };
}
