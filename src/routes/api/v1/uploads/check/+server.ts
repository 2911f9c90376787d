import Papa from 'papaparse';
import { json } from '@sveltejs/kit';
import { assertRole } from '$lib/server/auth/roles';
import { apiHandler } from '$lib/server/api/handler';
import { apiError, badQuery, parseApiQuery } from '$lib/server/api/respond';
import { db } from '$lib/server/db';
import { checkUpload } from '$lib/server/uploads/checkUpload';
import { uploadCsvLimits } from '$lib/server/uploads/readCsv';
import { summariseCheck } from '$lib/server/uploads/summary';
import { readUploadForm, uploadCheckQuerySchema } from '$lib/server/uploads/uploadForm';
import type { RequestHandler } from './$types';

/**
 * POST /api/v1/uploads/check — checks a CSV file (multipart: kind, file) without writing
 * anything. JSON: counts, every issue and a preview; ?format=csv: the issue report as a CSV
 * download (row, column, value, severity, message).
 */
export const POST: RequestHandler = apiHandler(async (event) => {
	assertRole(event.locals.user, 'contributor');
	const user = event.locals.user;
	const query = parseApiQuery(event.url, uploadCheckQuerySchema);
	if (!query.ok) return badQuery(query.fields);
	const { format } = query.data;
	const form = await readUploadForm(event.request);
	if (!form.ok) {
		return apiError(
			form.status === 413 ? 'payload_too_large' : 'bad_request',
			Object.values(form.errors).flat().join(' '),
			form.errors
		);
	}
	// A file past a shape limit is a CsvLimitError: 413, naming the row and the limit (`fields.file`).
	const check = await checkUpload(db, form.text, form.kind, {
		viewer: { groupIds: user.groupIds },
		uploaderId: user.id,
		limits: uploadCsvLimits
	});
	if (format === 'csv') {
		const csv = Papa.unparse(
			{
				fields: ['row', 'column', 'value', 'severity', 'message'],
				data: check.issues.map((i) => [i.row, i.column, i.value, i.severity, i.message])
			},
			{ newline: '\r\n', escapeFormulae: true }
		);
		const name = form.filename.replace(/\.[^.]+$/, '').replace(/[^A-Za-z0-9._-]/g, '_');
		return new Response(csv, {
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': `attachment; filename="${name}-report.csv"`
			}
		});
	}
	return json(summariseCheck(check, { issues: Number.MAX_SAFE_INTEGER, preview: 20 }));
});
