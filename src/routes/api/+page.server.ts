import { openApiDocument } from '$lib/server/openapi/document';
import { apiReference, type ApiReference } from '$lib/server/openapi/reference';
import type { PageServerLoad } from './$types';

// A document to read, with nothing to run: sent as HTML alone, without the page's data again
// for hydration (the code samples and examples would double its size).
export const csr = false;

let reference: ApiReference | undefined;

/** The reference page, read from the OpenAPI document (once per process, like the document). */
export const load: PageServerLoad = () => ({
	reference: (reference ??= apiReference(openApiDocument().document))
});
