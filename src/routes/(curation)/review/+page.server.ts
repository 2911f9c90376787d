import { error } from '@sveltejs/kit';
import { formatDate } from '$lib/format';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { queueQuerySchema } from '$lib/schemas/submission';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { listQueue } from '$lib/server/curation/submissionLists';
import { kindChoices } from '$lib/server/kinds';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'curator');
	const query = parseSearchParams(queueQuerySchema, event.url.searchParams);
	if (!query.ok) {
		error(400, {
			message: Object.entries(query.fields)
				.map(([k, v]) => `${k}: ${v.join('; ')}`)
				.join(' · ')
		});
	}
	const rows = await listQueue(db, query.data);
	return {
		filter: query.data,
		// The day is formatted here, so that the page needs no formatting code of its own.
		rows: rows.map((r) => ({ ...r, submittedOn: r.submittedAt && formatDate(r.submittedAt) })),
		kinds: kindChoices()
	};
};
