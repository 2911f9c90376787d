import { error } from '@sveltejs/kit';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { auditQuerySchema } from '$lib/schemas/submission';
import { requireRole } from '$lib/server/auth/guards';
import { listAudit } from '$lib/server/audit/log';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'curator');
	const query = parseSearchParams(auditQuerySchema, event.url.searchParams);
	if (!query.ok) {
		error(400, {
			message: Object.entries(query.fields)
				.map(([k, v]) => `${k}: ${v.join('; ')}`)
				.join(' · ')
		});
	}
	const q = query.data;
	const page = await listAudit(db, {
		action: q.action,
		actorEmail: q.actor,
		accession: q.accession,
		submissionId: q.submission,
		before: q.before,
		limit: 100
	});
	return { filter: q, ...page };
};
