/**
 * A session cookie (`name=value`) for an account, got by signing in through /signin as a browser
 * would. `origin` is the site's own origin when it differs from `base` (a server whose ORIGIN
 * is https while the test speaks plain http to it); `headers` go along (a client address).
 */
export async function signInCookie(
	base: string,
	email: string,
	password: string,
	options: { origin?: string; headers?: Record<string, string> } = {}
): Promise<string> {
	const res = await signInResponse(base, email, password, options);
	const session = sessionCookieOf(res);
	if (!session)
		throw new Error(
			`sign-in as ${email} gave no session (status ${res.status}): ${await res.text()}`
		);
	return session.split(';')[0] as string;
}

/** The answer of /signin's form action to the account's e-mail and password. */
export function signInResponse(
	base: string,
	email: string,
	password: string,
	options: { origin?: string; headers?: Record<string, string> } = {}
): Promise<Response> {
	return fetch(`${base}/signin`, {
		method: 'POST',
		headers: {
			origin: options.origin ?? base,
			'content-type': 'application/x-www-form-urlencoded',
			'x-sveltekit-action': 'true',
			...options.headers
		},
		body: new URLSearchParams({ email, password, redirectTo: '/' }),
		redirect: 'manual'
	});
}

/** The whole Set-Cookie line of the session cookie (over https named `__Secure-…`), if any. */
export function sessionCookieOf(res: Response): string | undefined {
	return res.headers.getSetCookie().find((c) => /^(__Secure-)?authjs\.session-token=/.test(c));
}
