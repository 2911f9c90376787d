import { generateKeyPair, randomBytes } from 'node:crypto';
import { promisify } from 'node:util';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { closeHttpServer } from '../loopback';
import Provider, { type KoaContextWithOIDC } from 'oidc-provider';

/**
 * A loopback OpenID Connect provider (the npm `oidc-provider`) standing in for an institution's
 * sign-in in the demo and the tests. Its built-in development log-in page accepts any e-mail
 * address as the login name (the password is ignored) and vouches for that address; consent is
 * granted without asking. Never used outside demo mode.
 */
export class FakeOidcProvider {
	private server: Server | null = null;
	port = 0;
	readonly clientId = 'hopline-demo';
	readonly clientSecret = randomBytes(24).toString('base64url');

	get issuer(): string {
		return `http://127.0.0.1:${this.port}`;
	}

	async listen(redirectUri: string, port = 0): Promise<void> {
		// The issuer URL carries the port, so the port is fixed before the provider is built.
		const server = createServer();
		await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
		this.port = (server.address() as AddressInfo).port;
		// Off the event loop: a 2048-bit RSA key takes a second or more, and the server is up.
		const { privateKey } = await promisify(generateKeyPair)('rsa', { modulusLength: 2048 });
		const provider = new Provider(this.issuer, {
			clients: [
				{
					client_id: this.clientId,
					client_secret: this.clientSecret,
					redirect_uris: [redirectUri],
					grant_types: ['authorization_code'],
					response_types: ['code']
				}
			],
			jwks: {
				keys: [{ ...privateKey.export({ format: 'jwk' }), kid: 'demo', alg: 'RS256', use: 'sig' }]
			},
			cookies: { keys: [randomBytes(32).toString('base64url')] },
			claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'] },
			// Auth.js reads the profile from the ID token alone, so the claims must be in it.
			conformIdTokenClaims: false,
			features: { devInteractions: { enabled: true } },
			ttl: {
				AuthorizationCode: 60,
				AccessToken: 600,
				IdToken: 600,
				Interaction: 600,
				Grant: 3600,
				Session: 3600
			},
			findAccount: (_ctx, id) => ({
				accountId: id,
				claims: () => ({
					sub: id,
					email: id.toLowerCase(),
					email_verified: true,
					name: id.split('@')[0]?.replace(/[._]/g, ' ') ?? id
				})
			}),
			loadExistingGrant: async (ctx: KoaContextWithOIDC) => {
				const clientId = ctx.oidc.client?.clientId as string;
				const grantId = ctx.oidc.result?.consent?.grantId ?? ctx.oidc.session?.grantIdFor(clientId);
				if (grantId) return ctx.oidc.provider.Grant.find(grantId);
				const grant = new ctx.oidc.provider.Grant({
					clientId,
					accountId: ctx.oidc.session?.accountId
				});
				grant.addOIDCScope('openid email profile');
				await grant.save();
				return grant;
			}
		});
		server.on('request', provider.callback());
		this.server = server;
	}

	async close(): Promise<void> {
		const server = this.server;
		if (!server) return;
		this.server = null;
		await closeHttpServer(server);
	}
}
