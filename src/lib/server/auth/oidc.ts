import { config } from '../config';
import { FakeOidcProvider } from './fakeOidc';

/** The OpenID Connect issuer to offer, if any: the configured one, or in demo mode the fake. */
export interface OidcSettings {
	issuer: string;
	clientId: string;
	clientSecret: string;
	name: string;
	/** Whether a first sign-in may join an existing account with the same (verified) address. */
	trustEmail: boolean;
}

let fake: Promise<FakeOidcProvider> | null = null;

export const OIDC_CALLBACK_PATH = '/auth/callback/oidc';

export async function oidcSettings(): Promise<OidcSettings | null> {
	if (config.OIDC_ISSUER && config.OIDC_CLIENT_ID && config.OIDC_CLIENT_SECRET) {
		return {
			issuer: config.OIDC_ISSUER,
			clientId: config.OIDC_CLIENT_ID,
			clientSecret: config.OIDC_CLIENT_SECRET,
			name: config.OIDC_NAME,
			trustEmail: config.OIDC_TRUST_EMAIL
		};
	}
	if (!config.HOPLINE_DEMO) return null;
	fake ??= (async () => {
		const provider = new FakeOidcProvider();
		await provider.listen(`${config.ORIGIN}${OIDC_CALLBACK_PATH}`, config.FAKE_OIDC_PORT);
		process.once('sveltekit:shutdown', () => void provider.close());
		return provider;
	})();
	const provider = await fake;
	return {
		issuer: provider.issuer,
		clientId: provider.clientId,
		clientSecret: provider.clientSecret,
		name: 'the demo institution',
		trustEmail: true
	};
}
