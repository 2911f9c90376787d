import { noticePreferenceForm } from '$lib/schemas/submission';
import { signOut } from '$lib/server/auth/authjs';
import { requireRole, requireUser } from '$lib/server/auth/guards';
import { endAllSessions } from '$lib/server/auth/sessions';
import { writeAudit } from '$lib/server/audit/log';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const row = await db
		.selectFrom('User')
		.select('curationNotices')
		.where('id', '=', user.id)
		.executeTakeFirstOrThrow();
	return {
		account: { email: user.email, name: user.name, role: user.role, groups: user.groupIds.length },
		curationNotices: row.curationNotices
	};
};

export const actions: Actions = {
	/** How a curator hears of new submissions. */
	notices: async (event) => {
		const user = requireRole(event, 'curator');
		const form = await parseForm(event.request, noticePreferenceForm);
		if (!form.ok) return form.failure;
		await db.transaction().execute(async (trx) => {
			await trx
				.updateTable('User')
				.set({ curationNotices: form.data.curationNotices })
				.where('id', '=', user.id)
				.execute();
			await writeAudit(trx, {
				actorId: user.id,
				action: 'account.notices',
				after: { curationNotices: form.data.curationNotices }
			});
		});
		return { saved: form.data.curationNotices };
	},
	/** Ends every session of the account, on every device, this one included. */
	signOutEverywhere: async (event) => {
		const user = requireUser(event);
		await db.transaction().execute(async (trx) => {
			await endAllSessions(trx, user.id);
			await writeAudit(trx, { actorId: user.id, action: 'account.sign_out_everywhere' });
		});
		// Clears this browser's cookie and redirects (to the form's redirectTo).
		await signOut(event);
	}
};
