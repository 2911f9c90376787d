import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { redirectTarget } from '$lib/schemas/account';
import { oidcSettings } from '$lib/server/auth/oidc';
import { signInWith } from '$lib/server/auth/signInWith';
import { verifyPassword } from '$lib/server/auth/password';
import { accountAttempts, addressAttempts } from '$lib/server/auth/rateLimit';
import { findUserForSignIn } from '$lib/server/auth/users';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

const form = z.object({
	email: z.string().trim().toLowerCase().email('enter the e-mail address of your account'),
	password: z.string().min(1, 'enter your password').max(1000),
	redirectTo: redirectTarget
});

export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, '/account');
	const oidc = await oidcSettings();
	return {
		redirectTo: url.searchParams.get('redirectTo') ?? '/',
		failed: url.searchParams.get('error'),
		oidcName: oidc?.name ?? null
	};
};

const minutes = (ms: number) => Math.max(1, Math.ceil(ms / 60_000));

export const actions: Actions = {
	default: async (event) => {
		const data = Object.fromEntries(await event.request.formData());
		const parsed = form.safeParse(data);
		const email = typeof data.email === 'string' ? data.email : '';
		if (!parsed.success) {
			const errors: Record<string, string[]> = {};
			for (const issue of parsed.error.issues)
				(errors[String(issue.path[0])] ??= []).push(issue.message);
			return fail(400, { email, errors });
		}
		const address = event.getClientAddress();
		const wait = Math.max(
			accountAttempts.retryAfterMs(parsed.data.email),
			addressAttempts.retryAfterMs(address)
		);
		if (wait > 0) {
			return fail(429, {
				email,
				errors: { form: [`Too many failed attempts. Try again in ${minutes(wait)} minute(s).`] }
			});
		}
		const user = await findUserForSignIn(db, parsed.data.email);
		const ok =
			!!user &&
			user.disabledAt === null &&
			(await verifyPassword(parsed.data.password, user.passwordHash));
		if (!ok) {
			accountAttempts.recordFailure(parsed.data.email);
			addressAttempts.recordFailure(address);
			return fail(400, { email, errors: { form: ['Wrong e-mail address or password.'] } });
		}
		if (!user.emailVerified) {
			return fail(400, {
				email,
				errors: { form: ['Confirm your e-mail address first: follow the link we sent you.'] }
			});
		}
		accountAttempts.reset(parsed.data.email);
		await signInWith(event, 'password', {
			email: parsed.data.email,
			password: parsed.data.password,
			redirectTo: parsed.data.redirectTo
		});
	}
};
