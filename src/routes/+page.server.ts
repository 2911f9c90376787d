import { catalogueFacets } from '$lib/server/catalogue/facets';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	facets: await catalogueFacets(db, locals.viewer)
});
