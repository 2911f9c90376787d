import { error } from '@sveltejs/kit';
import { auditQuerySchema } from '$lib/schemas/auditQuery';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { requireRole } from '$lib/server/auth/guards';
import { describeAudit } from '$lib/server/audit/describe';
import { listAudit } from '$lib/server/audit/log';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

/** Records per page of the audit log. */
const PAGE_SIZE = 50;

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'curator');
	const query = parseSearchParams(auditQuerySchema, event.url.searchParams);
	if (!query.ok) {
		error(400, {
			message: 'Some filters of the audit log are not valid.',
			fields: query.fields
		});
	}
	const q = query.data;
	const page = await listAudit(db, {
		action: q.action,
		actor: q.actor,
		accession: q.accession,
		submissionId: q.submission,
		from: q.from,
		to: q.to,
		after: q.after,
		limit: PAGE_SIZE
	});
	return {
		filter: {
			action: q.action ?? '',
			actor: q.actor ?? '',
			accession: q.accession ?? '',
			submission: q.submission ? String(q.submission) : '',
			from: q.from ?? '',
			to: q.to ?? ''
		},
		paged: q.after !== undefined,
		lines: await describeAudit(db, page.rows),
		next: page.next
	};
};
