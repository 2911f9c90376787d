import { config } from '$lib/server/config';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => ({
	demo: config.HOPLINE_DEMO,
	user: locals.user
		? { name: locals.user.name, email: locals.user.email, role: locals.user.role }
		: null
});
