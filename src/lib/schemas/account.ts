import { z } from 'zod';

/* Account forms: sign-up, password reset. */

export const MIN_PASSWORD_LENGTH = 10;

const password = z
	.string()
	.min(MIN_PASSWORD_LENGTH, `at least ${MIN_PASSWORD_LENGTH} characters`)
	.max(200, 'at most 200 characters');

export const signUpForm = z
	.object({
		name: z.string().trim().min(2, 'your name, as it should appear on your contributions').max(120),
		email: z.string().trim().toLowerCase().email('an e-mail address you can read'),
		password,
		confirm: z.string()
	})
	.refine((f) => f.password === f.confirm, {
		path: ['confirm'],
		message: 'the two passwords differ'
	});

export const resetRequestForm = z.object({
	email: z.string().trim().toLowerCase().email('the e-mail address of your account')
});

export const resetForm = z
	.object({ password, confirm: z.string() })
	.refine((f) => f.password === f.confirm, {
		path: ['confirm'],
		message: 'the two passwords differ'
	});

/** Where to go after signing in: only paths on this site, so a link cannot send people elsewhere. */
export const redirectTarget = z
	.string()
	.regex(/^\/(?!\/)/)
	.catch('/');

export const signInLinkForm = z.object({
	email: z.string().trim().toLowerCase().email('enter the e-mail address of your account'),
	redirectTo: redirectTarget
});
