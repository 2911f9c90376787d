import { redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	requireRole(event, 'admin');
	redirect(303, '/admin/users');
};
