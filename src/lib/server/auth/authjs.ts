import { CredentialsSignin, SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { KyselyAdapter, type Database as AuthDatabase } from '@auth/kysely-adapter';
import type { RequestEvent } from '@sveltejs/kit';
import type { Kysely } from 'kysely';
import { randomBytes } from 'node:crypto';
import { z } from 'zod';
import { config } from '../config';
import { db } from '../db';
import { sendMailInBackground } from '../mail/mailer';
import { oidcSettings } from './oidc';
import { checkPasswordSignIn, type PasswordRefusal } from './passwordSignIn';
import { takeMailRequest } from './rateLimit';
import { endSession, sessionIsLive, startSession } from './sessions';
import { findUserForSignIn } from './users';

/*
 * Auth.js wiring: e-mail + password, e-mail sign-in links, and OpenID Connect. Sessions are JWT
 * cookies carrying the user id and the session's id and generation (auth/sessions.ts); every
 * read of a session checks on the server that it was not ended, and role and groups are read
 * from the database on every request (src/hooks.server.ts).
 * The configuration is built per request: the demo's OIDC fake starts on first use, and the
 * limits need the client's address (`event.getClientAddress()`), which Auth.js does not pass on.
 * Limits are enforced here, inside Auth.js, so they hold for the /signin and /signin/link forms
 * and for direct POSTs to /auth/callback/password and /auth/signin/email alike.
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

/**
 * A refused password sign-in, with why. Auth.js turns it into `?error=CredentialsSignin&code=…`
 * for a direct POST, and lets it through to the caller of `signIn` from a form action.
 */
export class PasswordRefused extends CredentialsSignin {
	constructor(readonly refusal: PasswordRefusal) {
		super();
		this.code = refusal.reason;
	}
}

const passwordProvider = (event: RequestEvent) =>
	Credentials({
		id: 'password',
		name: 'E-mail and password',
		credentials: {
			email: { label: 'E-mail' },
			password: { label: 'Password', type: 'password' }
		},
		authorize: async (raw) => {
			const parsed = credentialsSchema.safeParse(raw);
			if (!parsed.success) throw new PasswordRefused({ ok: false, reason: 'wrong' });
			const outcome = await checkPasswordSignIn(db, {
				...parsed.data,
				clientAddress: event.getClientAddress()
			});
			if (!outcome.ok) throw new PasswordRefused(outcome);
			return outcome.user;
		}
	});

const emailLinkProvider = Nodemailer({
	id: 'email',
	name: 'E-mail link',
	// Mail leaves through the app's own mailer (SMTP_URL, or the demo's fake), not this server.
	server: config.SMTP_URL ?? 'smtp://127.0.0.1:25',
	from: config.MAIL_FROM,
	maxAge: SIGN_IN_LINK_HOURS * 3600,
	sendVerificationRequest: ({ identifier, url }) => {
		// Not awaited: an unknown address sends nothing, and the answer's timing must not tell.
		sendMailInBackground({
			to: identifier,
			subject: 'Your Hopline sign-in link',
			text: `Follow this link to sign in to Hopline:\n\n${url}\n\nIt works once, for ${SIGN_IN_LINK_HOURS} hour. If you did not ask for it, ignore this message.\n`
		});
	}
});

/** Where Auth.js sends people after mailing a link; answered alike when no link was sent. */
const LINK_SENT_PATH = '/auth/verify-request?provider=email&type=email';
export const LINK_REFUSED_PATH = '/signin/link?error=TooManyRequests';

async function authConfig(event: RequestEvent): Promise<SvelteKitAuthConfig> {
	const oidc = await oidcSettings();
	return {
		trustHost: true,
		secret,
		adapter,
		session: { strategy: 'jwt', maxAge: config.SESSION_HOURS * 3600, updateAge: 3600 },
		// Cookie names and flags follow the site's scheme (ORIGIN), never a forwarded header.
		useSecureCookies: event.url.protocol === 'https:',
		pages: { signIn: '/signin', error: '/signin', verifyRequest: '/signin/link' },
		logger: {
			// A refused password is an answer, not a fault; anything else is logged.
			error: (e) => {
				if (!(e instanceof CredentialsSignin)) console.error('[auth]', e);
			}
		},
		providers: [
			passwordProvider(event),
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
			/**
			 * Disabled accounts never sign in; OIDC needs an address. A request for a sign-in link is
			 * counted against the mail limits, and answered exactly as a sent link is when the
			 * address has no enabled account (so nothing is sent, and nothing is revealed).
			 */
			signIn: async ({ user, account, profile, email }) => {
				const address = user.email?.toLowerCase();
				if (!address) return false;
				if (account?.provider === 'email' && email?.verificationRequest) {
					if (takeMailRequest(event.getClientAddress(), address) > 0) return LINK_REFUSED_PATH;
					const existing = await findUserForSignIn(db, address);
					return existing && existing.disabledAt === null ? true : LINK_SENT_PATH;
				}
				const existing = await findUserForSignIn(db, address);
				if (existing?.disabledAt) return false;
				if (account?.provider === 'email') return !!existing;
				if (account?.provider === 'oidc') return profile?.email_verified !== false;
				return true;
			},
			/** At sign-in, the session gets its id and generation; afterwards it must still be live. */
			jwt: async ({ token, user }) => {
				if (user?.id) return { ...token, ...(await startSession(db, user.id)) };
				return (await sessionIsLive(db, token)) ? token : null;
			},
			session: ({ session, token }) => {
				if (token.sub) session.user.id = token.sub;
				return session;
			}
		},
		events: {
			signOut: async (message) => {
				if ('token' in message && message.token) await endSession(db, message.token);
			}
		}
	};
}

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(authConfig);
