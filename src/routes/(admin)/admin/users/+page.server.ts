import {
	accessRequestsQuerySchema,
	dismissAccessRequestForm,
	setDisabledForm,
	setRoleForm
} from '$lib/schemas/admin';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { closeAccessRequests, openAccessRequests } from '$lib/server/admin/accessRequests';
import {
	AdminRuleError,
	displayName,
	listUsers,
	setUserDisabled,
	setUserRole
} from '$lib/server/admin/accounts';
import { ROLES } from '$lib/roles';
import { requireRole } from '$lib/server/auth/guards';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/http/forms';
import { queryError, toFormFailure } from '$lib/server/http/failures';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const query = parseSearchParams(accessRequestsQuerySchema, event.url.searchParams);
	if (!query.ok) queryError(query.fields);
	return {
		users: await listUsers(db),
		requests: await openAccessRequests(db, { page: query.data.requests }),
		roles: ROLES
	};
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
				(r) => ({
					done:
						r.from === r.to
							? `${r.name} has the ${r.to} role already.`
							: `Role of ${r.name} changed from ${r.from} to ${r.to}.`
				}),
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
				(r) => ({
					done: form.data.disabled
						? `Account of ${r.name} disabled; they are signed out everywhere.`
						: `Account of ${r.name} enabled.`
				}),
				(e: unknown) => toFormFailure(e, event)
			);
	},
	/** Closes a request for contributor access without giving the role. */
	dismiss: async (event) => {
		const admin = requireRole(event, 'admin');
		const form = await parseForm(event.request, dismissAccessRequestForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute(async (trx) => {
				const closed = await closeAccessRequests(trx, admin.id, form.data.userId, 'dismissed');
				if (!closed) throw new AdminRuleError('userId', 'that request is no longer open');
				const user = await trx
					.selectFrom('User')
					.select(['name', 'email'])
					.where('id', '=', form.data.userId)
					.executeTakeFirst();
				return user ? displayName(user) : 'the account';
			})
			.then(
				(name) => ({ done: `Request of ${name} for contributor access dismissed.` }),
				(e: unknown) => toFormFailure(e, event)
			);
	}
};
