import { requireUser } from '$lib/server/auth/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	return {
		account: { email: user.email, name: user.name, role: user.role, groups: user.groupIds.length }
	};
};
