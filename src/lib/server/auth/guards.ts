import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '../db/schema';
import { roleAtLeast, type SessionUser } from './roles';

/*
 * Guards for loads and actions: the first statement of every protected one. Signed-out visitors
 * of a page are sent to sign in and brought back; API callers get 401/403 from the API wrapper.
 */
export function requireUser(event: Pick<RequestEvent, 'locals' | 'url'>): SessionUser {
	const user = event.locals.user;
	if (!user)
		redirect(
			303,
			`/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`
		);
	return user;
}

export function requireRole(event: Pick<RequestEvent, 'locals' | 'url'>, least: Role): SessionUser {
	const user = requireUser(event);
	if (!roleAtLeast(user.role, least))
		error(403, {
			message: `This page needs the ${least} role; you are signed in as ${user.role}.`,
			neededRole: least
		});
	return user;
}
