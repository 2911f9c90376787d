import { error } from '@sveltejs/kit';
import { templateCsv } from '$lib/catalogue/uploadColumns';
import { UPLOAD_KINDS, type UploadKind } from '$lib/kinds';
import type { RequestHandler } from './$types';

/** GET /csv/templates/{kind}.csv — the header of an upload and one invented example row. */
export const GET: RequestHandler = ({ params }) => {
	const kind = params.file.replace(/\.csv$/, '');
	if (!(UPLOAD_KINDS as readonly string[]).includes(kind) || !params.file.endsWith('.csv')) {
		error(404, {
			message: `no template ${params.file}; there are ${UPLOAD_KINDS.map((k) => `${k}.csv`).join(', ')}`
		});
	}
	return new Response(templateCsv(kind as UploadKind), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="hopline-${kind}-template.csv"`
		}
	});
};
