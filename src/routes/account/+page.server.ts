import { orcidForm } from '$lib/schemas/orcid';
import { apiTokenForm, revokeApiTokenForm } from '$lib/schemas/apiToken';
import { noticePreferenceForm } from '$lib/schemas/submission';
import { createApiToken, listApiTokens, revokeApiToken } from '$lib/server/auth/apiTokens';
import { curationNoticesOf, setCurationNotices, signOutEverywhere } from '$lib/server/auth/account';
import { signOut } from '$lib/server/auth/authjs';
import { requireRole, requireUser } from '$lib/server/auth/guards';
import { orcidOf, setOrcid } from '$lib/server/citations/orcid';
import { db } from '$lib/server/db';
import { toFormFailure } from '$lib/server/http/failures';
import { parseForm } from '$lib/server/http/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return {
		account: { email: user.email, name: user.name, role: user.role, groups: user.groupIds.length },
		curationNotices: await curationNoticesOf(db, user.id),
		orcid: await orcidOf(db, user.id),
		apiTokens: await listApiTokens(db, user.id)
	};
};

export const actions: Actions = {
	/** How a curator hears of new submissions. */
	notices: async (event) => {
		const user = requireRole(event, 'curator');
		const form = await parseForm(event.request, noticePreferenceForm);
		if (!form.ok) return form.failure;
		await db
			.transaction()
			.execute((trx) => setCurationNotices(trx, user.id, form.data.curationNotices));
		return { saved: form.data.curationNotices };
	},
	/** The ORCID iD citations name the person with (empty removes it). */
	orcid: async (event) => {
		const user = requireUser(event);
		const form = await parseForm(event.request, orcidForm);
		if (!form.ok) return form.failure;
		await db.transaction().execute((trx) => setOrcid(trx, user.id, form.data.orcid));
		return { orcidSaved: form.data.orcid };
	},
	/** A personal API token: shown in this answer only, stored as a hash (auth/apiTokens.ts). */
	createToken: async (event) => {
		const user = requireUser(event);
		const form = await parseForm(event.request, apiTokenForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => createApiToken(trx, user, form.data))
			.then(
				({ summary, token }) => {
					// The token is in this answer: nothing between here and the browser may keep it.
					event.setHeaders({ 'cache-control': 'no-store' });
					return { createdToken: { ...summary, token } };
				},
				(e: unknown) => toFormFailure(e, event, form.values)
			);
	},
	/** Revokes one of the user's own tokens; the next request with it gets 401. */
	revokeToken: async (event) => {
		const user = requireUser(event);
		const form = await parseForm(event.request, revokeApiTokenForm);
		if (!form.ok) return form.failure;
		return db
			.transaction()
			.execute((trx) => revokeApiToken(trx, user.id, form.data.tokenId))
			.then(
				() => ({ revokedToken: form.data.tokenId }),
				(e: unknown) => toFormFailure(e, event, form.values)
			);
	},
	/** Ends every session of the account, on every device, this one included. */
	signOutEverywhere: async (event) => {
		const user = requireUser(event);
		await db.transaction().execute((trx) => signOutEverywhere(trx, user.id));
		// Clears this browser's cookie and redirects (to the form's redirectTo).
		await signOut(event);
	}
};
