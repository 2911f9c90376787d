import { listProteins } from '$lib/server/kinds/protein';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	proteins: await listProteins(db, {}, { sort: 'name', limit: 500, offset: 0 }, locals.viewer)
});
