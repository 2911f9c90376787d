import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guards';
import { demoMailbox } from '$lib/server/mail/mailer';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'admin');
	const box = await demoMailbox();
	if (!box) error(404, { message: 'The mailbox of the local mail fake exists in demo mode only.' });
	return { messages: box.messages.slice(0, 100) };
};
