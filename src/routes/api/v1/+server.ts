import { apiHandler } from '$lib/server/api/handler';
import { openApiDocument } from '$lib/server/openapi/document';
import { apiIndex } from '$lib/server/openapi/reference';
import type { RequestHandler } from './$types';

/** GET /api/v1 — what the API offers, read from its OpenAPI document. */
export const GET: RequestHandler = apiHandler(async () =>
	Response.json(apiIndex(openApiDocument().document))
);
