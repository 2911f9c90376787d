import { error } from '@sveltejs/kit';
import { serveAttachmentFile } from '$lib/server/attachments/serve';
import { attachmentStore } from '$lib/server/attachments/store';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/*
 * An attachment's file: /files/{id}/original, /preview, /thumbnail, /data. Visibility is checked on
 * every request (serve.ts → attachmentForReader), the same 404 for hidden and missing files.
 */
export const GET: RequestHandler = async ({ params, locals, request }) => {
	const served = await serveAttachmentFile(
		db,
		attachmentStore(),
		locals.user,
		Number(params.id),
		params.variant,
		request.headers.get('if-none-match')
	);
	if (served.status === 404) error(404, 'No such file (or not visible to you).');
	if (served.status === 304) return new Response(null, { status: 304, headers: served.headers });
	return new Response(served.body, { headers: served.headers });
};
