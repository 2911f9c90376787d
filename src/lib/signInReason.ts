/*
 * Why a visitor was sent to sign in, said on the sign-in page. Read from the page they were
 * going to (`redirectTo`), matched against a fixed list of the app's protected areas; nothing
 * of the address itself is ever shown, so a crafted link cannot put words on the page.
 */

const REASONS: readonly (readonly [prefix: string, reason: string])[] = [
	['/submissions/new', 'Sign in to submit entries.'],
	['/submissions/upload', 'Sign in to submit entries.'],
	['/submissions', 'Sign in to see your submissions.'],
	['/review', 'Sign in to review submissions.'],
	['/audit', 'Sign in to read the audit log.'],
	['/admin', 'Sign in to manage the registry.'],
	['/access', 'Sign in to ask for contributor access.'],
	['/account', 'Sign in to see your account, saved searches and API tokens.']
];

/** The reason for a redirect target, or null when it is not a known protected page. */
export function signInReason(redirectTo: string | null): string | null {
	if (!redirectTo || !redirectTo.startsWith('/') || redirectTo.startsWith('//')) return null;
	let path: string;
	try {
		path = new URL(redirectTo, 'http://x.invalid').pathname;
	} catch {
		return null;
	}
	const hit = REASONS.find(([p]) => path === p || path.startsWith(`${p}/`));
	return hit ? hit[1] : null;
}
