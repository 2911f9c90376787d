import { error } from '@sveltejs/kit';
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
	return { filter: query.data, rows: await listQueue(db, query.data), kinds: kindChoices() };
};
