/** A session cookie for an account, got by signing in through /signin as a browser would. */
export async function signInCookie(base: string, email: string, password: string): Promise<string> {
	const res = await fetch(`${base}/signin`, {
		method: 'POST',
		headers: {
			origin: base,
			'content-type': 'application/x-www-form-urlencoded',
			'x-sveltekit-action': 'true'
		},
		body: new URLSearchParams({ email, password, redirectTo: '/' }),
		redirect: 'manual'
	});
	const session = res.headers.getSetCookie().find((c) => c.startsWith('authjs.session-token='));
	if (!session)
		throw new Error(
			`sign-in as ${email} gave no session (status ${res.status}): ${await res.text()}`
		);
	return session.split(';')[0] as string;
}
