import { SvelteKitAuth } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { randomBytes } from 'node:crypto';
import { z } from 'zod';
import { config } from '../config';
import { db } from '../db';
import { verifyPassword } from './password';
import { findUserForSignIn } from './users';

/**
 * Auth.js wiring. Sessions are JWT cookies carrying only the user id; role and groups are read
 * from the database on every request (src/hooks.server.ts), so a role change or a disabled
 * account takes effect at once rather than when the token is next refreshed.
 */

const secret =
	config.AUTH_SECRET ??
	(() => {
		console.warn(
			'AUTH_SECRET is not set: using a random one, so sessions end when the server restarts.'
		);
		return randomBytes(32).toString('base64');
	})();

const credentialsSchema = z.object({
	email: z.string().trim().email(),
	password: z.string().min(1).max(1000)
});

export const {
	handle: authHandle,
	signIn,
	signOut
} = SvelteKitAuth({
	trustHost: true,
	secret,
	session: { strategy: 'jwt', maxAge: config.SESSION_HOURS * 3600, updateAge: 3600 },
	pages: { signIn: '/signin', error: '/signin' },
	providers: [
		Credentials({
			id: 'password',
			name: 'E-mail and password',
			credentials: {
				email: { label: 'E-mail' },
				password: { label: 'Password', type: 'password' }
			},
			authorize: async (raw) => {
				const parsed = credentialsSchema.safeParse(raw);
				if (!parsed.success) return null;
				const user = await findUserForSignIn(db, parsed.data.email);
				if (!user || user.disabledAt !== null || !user.emailVerified) return null;
				if (!(await verifyPassword(parsed.data.password, user.passwordHash))) return null;
				return { id: user.id, email: user.email, name: user.name };
			}
		})
	],
	callbacks: {
		session: ({ session, token }) => {
			if (token.sub) session.user.id = token.sub;
			return session;
		}
	}
});
