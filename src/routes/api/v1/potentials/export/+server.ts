import { POTENTIAL_CSV } from '$lib/catalogue/csvRows';
import { potentialExportQuery } from '$lib/schemas/catalogueQuery';
import { apiHandler } from '$lib/server/api/handler';
import { badQuery, csvText, parseApiQuery } from '$lib/server/api/respond';
import { exportPotentials } from '$lib/server/catalogue/potentialExport';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { openReadSnapshot } from '$lib/server/db/snapshot';
import type { RequestHandler } from './$types';

/**
 * GET /api/v1/potentials/export — every potential matching the catalogue filters, in the chosen
 * order, as one CSV streamed while it is read. The number of rows is sent up front in
 * `X-Total-Count`; the body holds exactly that many rows after the header row.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const query = parseApiQuery(url, potentialExportQuery);
	if (!query.ok) return badQuery(query.fields);
	const { sort, order, ...filter } = query.data;
	const found = await exportPotentials(
		db,
		() => openReadSnapshot(config.DATABASE_PATH),
		filter,
		{ sort, order },
		locals.viewer,
		{
			maxRows: config.EXPORT_MAX_ROWS,
			concurrency: config.EXPORT_CONCURRENCY,
			timeLimitMs: config.EXPORT_TIME_LIMIT_SECONDS * 1000
		}
	);
	const encoder = new TextEncoder();
	const body = new ReadableStream<Uint8Array>({
		start(controller) {
			controller.enqueue(encoder.encode(`${csvText(POTENTIAL_CSV, [])}\r\n`));
			found.cutOff.addEventListener('abort', () => controller.error(found.cutOff.reason));
		},
		async pull(controller) {
			try {
				for (;;) {
					const next = await found.chunks.next();
					if (next.done) return controller.close();
					if (next.value.length === 0) continue;
					const rows = csvText(POTENTIAL_CSV, next.value, false);
					return controller.enqueue(encoder.encode(`${rows}\r\n`));
				}
			} catch (e) {
				controller.error(e);
			}
		},
		async cancel() {
			await found.cancel();
		}
	});
	return new Response(body, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="potentials.csv"',
			'x-total-count': String(found.total)
		}
	});
});
