import { addMemberForm, createGroupForm, removeMemberForm } from '$lib/schemas/admin';
import {
	addGroupMember,
	createGroup,
	listGroups,
	removeGroupMember
} from '$lib/server/admin/accounts';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	return { groups: await listGroups(db) };
};

export const actions: Actions = {
	create: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, createGroupForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => createGroup(trx, admin.id, form.data))
			.then(
				() => ({
					done: `Group ${form.data.name} created (short name ${form.data.slug}).`
				}),
				(e: unknown) => toFormFailure(e, event, form.values)
			);
	},
	add: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, addMemberForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => addGroupMember(trx, admin.id, form.data.groupId, form.data.email))
			.then(
				(r) => ({ done: `${r.name} added to ${r.group}.` }),
				(e: unknown) => toFormFailure(e, event, form.values)
			);
	},
	remove: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, removeMemberForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => removeGroupMember(trx, admin.id, form.data.groupId, form.data.userId))
			.then(
				(r) => ({ done: `${r.name} removed from ${r.group}.` }),
				(e: unknown) => toFormFailure(e, event, form.values)
			);
	}
};
