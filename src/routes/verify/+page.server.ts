import { verifyEmail } from '$lib/server/auth/selfService';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => ({
	verified: await verifyEmail(db, url.searchParams.get('token') ?? '')
});
