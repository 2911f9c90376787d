import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { listOwnSubmissions } from '$lib/server/curation/submissionLists';
import { kindChoices } from '$lib/server/kinds';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'contributor');
	return { submissions: await listOwnSubmissions(db, user), kinds: kindChoices() };
};
