import { apiHandler } from '$lib/server/api/handler';
import { documentResponse } from '$lib/server/openapi/serve';
import type { RequestHandler } from './$types';

/** GET /api/v1/openapi.json — the OpenAPI 3.1 document of this API (built once per process). */
export const GET: RequestHandler = apiHandler(async ({ request }) => documentResponse(request));
