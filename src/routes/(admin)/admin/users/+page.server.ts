import { setDisabledForm, setRoleForm } from '$lib/schemas/admin';
import { listUsers, setUserDisabled, setUserRole } from '$lib/server/admin/accounts';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { users: await listUsers(db) };
};

export const actions: Actions = {
	role: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, setRoleForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => setUserRole(trx, admin.id, form.data.userId, form.data.role))
			.then(
				() => ({ done: 'Role changed.' }),
				(e: unknown) => toFormFailure(e, event)
			);
	},
	disabled: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, setDisabledForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => setUserDisabled(trx, admin.id, form.data.userId, form.data.disabled))
			.then(
				() => ({ done: form.data.disabled ? 'Account disabled.' : 'Account enabled.' }),
				(e: unknown) => toFormFailure(e, event)
			);
	}
};
