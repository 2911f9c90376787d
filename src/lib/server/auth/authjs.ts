import { SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { KyselyAdapter, type Database as AuthDatabase } from '@auth/kysely-adapter';
import type { Kysely } from 'kysely';
import { randomBytes } from 'node:crypto';
import { z } from 'zod';
import { config } from '../config';
import { db } from '../db';
import { sendMail } from '../mail/mailer';
import { oidcSettings } from './oidc';
import { verifyPassword } from './password';
import { findUserForSignIn } from './users';

/**
 * Auth.js wiring: e-mail + password, e-mail sign-in links, and OpenID Connect. Sessions are JWT
 * cookies carrying only the user id; role and groups are read from the database on every
 * request (src/hooks.server.ts), so a role change or a disabled account takes effect at once.
 * The configuration is built per request because the demo's OIDC fake starts on first use.
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

// The adapter converts dates to ISO strings itself on SQLite, so the rows it writes are the ones
// our schema declares; only its declared types differ (Date where SQLite stores text).
const adapter = KyselyAdapter(db as unknown as Kysely<AuthDatabase>);

export const SIGN_IN_LINK_HOURS = 1;

const passwordProvider = Credentials({
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
});

const emailLinkProvider = Nodemailer({
	id: 'email',
	name: 'E-mail link',
	// Mail leaves through the app's own mailer (SMTP_URL, or the demo's fake), not this server.
	server: config.SMTP_URL ?? 'smtp://127.0.0.1:25',
	from: config.MAIL_FROM,
	maxAge: SIGN_IN_LINK_HOURS * 3600,
	sendVerificationRequest: async ({ identifier, url }) => {
		await sendMail({
			to: identifier,
			subject: 'Your Hopline sign-in link',
			text: `Follow this link to sign in to Hopline:\n\n${url}\n\nIt works once, for ${SIGN_IN_LINK_HOURS} hour. If you did not ask for it, ignore this message.\n`
		});
	}
});

async function authConfig(): Promise<SvelteKitAuthConfig> {
	const oidc = await oidcSettings();
	return {
		trustHost: true,
		secret,
		adapter,
		session: { strategy: 'jwt', maxAge: config.SESSION_HOURS * 3600, updateAge: 3600 },
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/link' },
		providers: [
			passwordProvider,
			emailLinkProvider,
			...(oidc
				? [
						{
							id: 'oidc',
							name: oidc.name,
							type: 'oidc' as const,
							issuer: oidc.issuer,
							clientId: oidc.clientId,
							clientSecret: oidc.clientSecret,
							checks: ['pkce' as const, 'state' as const],
							allowDangerousEmailAccountLinking: oidc.trustEmail
						}
					]
				: [])
		],
		callbacks: {
			/** Disabled accounts never sign in; links go only to existing accounts; OIDC needs an address. */
			signIn: async ({ user, account, profile, email }) => {
				const address = user.email?.toLowerCase();
				if (!address) return false;
				const existing = await findUserForSignIn(db, address);
				if (existing?.disabledAt) return false;
				if (account?.provider === 'email') return email?.verificationRequest ? !!existing : true;
				if (account?.provider === 'oidc') return profile?.email_verified !== false;
				return true;
			},
			session: ({ session, token }) => {
				if (token.sub) session.user.id = token.sub;
				return session;
			}
		}
	};
}

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(authConfig);
