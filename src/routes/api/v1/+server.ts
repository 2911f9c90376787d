import { apiHandler } from '$lib/server/api/handler';
import { openApiDocument } from '$lib/server/openapi/document';
import { apiIndex } from '$lib/server/openapi/reference';
import type { RequestHandler } from './$types';

let index: ReturnType<typeof apiIndex> | undefined;

/** GET /api/v1 — what the API offers, read from its OpenAPI document (once per process). */
export const GET: RequestHandler = apiHandler(async () =>
	Response.json((index ??= apiIndex(openApiDocument().document)))
);
