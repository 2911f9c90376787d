import { roleAtLeast } from '$lib/roles';
import { config } from '$lib/server/config';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => {
	const user = locals.user;
	return {
		demo: config.HOPLINE_DEMO,
		user: user ? { name: user.name, email: user.email, role: user.role } : null,
		// The main menu's links for the account's role, decided here so that every page's start-up
		// code carries no copy of the role order. Links only: each page checks the role itself.
		menu: {
			submissions: user !== null && roleAtLeast(user.role, 'contributor'),
			curation: user !== null && roleAtLeast(user.role, 'curator'),
			admin: user?.role === 'admin'
		}
	};
};
