import { formatDate } from '$lib/format';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { listOwnSubmissions } from '$lib/server/curation/submissionLists';
import { kindChoices } from '$lib/server/kinds';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'contributor');
	const submissions = await listOwnSubmissions(db, user);
	return {
		// The day is formatted here, so that the page needs no formatting code of its own.
		submissions: submissions.map((s) => ({ ...s, updatedOn: formatDate(s.updatedAt) })),
		kinds: kindChoices()
	};
};
