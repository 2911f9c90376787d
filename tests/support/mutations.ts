import type { Role } from '$lib/server/db/schema';

/**
 * Every mutating route of the app — form actions and POST/PUT/PATCH/DELETE handlers — with the
 * least role that may use it (null: anyone). tests/unit/mutations.test.ts fails when a route
 * exists that this table does not list, and tests/e2e/authorization.test.ts tries each one as
 * signed out, reader, contributor, curator and admin.
 */
export interface Mutation {
	/** Route file, relative to src/routes. */
	file: string;
	/** Form action name, or HTTP method for +server.ts. */
	name: string;
	/** URL to call. */
	url: string;
	least: Role | null;
	/** A harmless body for the attempt (form fields or JSON). */
	body: Record<string, string> | { json: unknown };
	/**
	 * The answer when the role check lets the caller through. The bodies are harmless, so most
	 * answers are the specific refusal that comes after the guard (a validation failure, an
	 * unknown submission); a server error or a stray 404 no longer passes for "allowed".
	 * For +server.ts: the HTTP status and the error code of the JSON body. For a form action: the
	 * ActionResult's type and status (an `error` result's status is the HTTP status), and for an
	 * error its message.
	 */
	allowed: Answer;
	/** Ends the caller's session(s) when allowed: the matrix signs in again after trying it. */
	endsSession?: true;
}

export interface Answer {
	status: number;
	/** Form actions only. */
	type?: 'success' | 'failure' | 'redirect' | 'error';
	/** +server.ts only: `error.code` of the JSON body. */
	code?: string;
	/** Form action errors only. */
	message?: string;
}

const invalid: Answer = { type: 'failure', status: 400 };
const noSubmission: Answer = { type: 'error', status: 404, message: 'no submission 999999' };

export const MUTATIONS: Mutation[] = [
	{
		file: 'signin/+page.server.ts',
		name: 'default',
		url: '/signin',
		least: null,
		body: { email: 'nobody@example.test', password: 'x' },
		allowed: invalid
	},
	{
		file: 'signup/+page.server.ts',
		name: 'default',
		url: '/signup',
		least: null,
		body: { name: 'x', email: 'not-an-address', password: 'short', confirm: 'other' },
		allowed: invalid
	},
	{
		file: 'reset/+page.server.ts',
		name: 'default',
		url: '/reset',
		least: null,
		body: { email: 'not-an-address' },
		allowed: invalid
	},
	{
		file: 'reset/[token]/+page.server.ts',
		name: 'default',
		url: '/reset/not-a-real-token-value-xx',
		least: null,
		body: { password: 'short', confirm: 'x' },
		allowed: invalid
	},
	{
		file: 'signin/link/+page.server.ts',
		name: 'default',
		url: '/signin/link',
		least: null,
		body: { email: 'not-an-address' },
		allowed: invalid
	},
	{
		file: 'signin/oidc/+page.server.ts',
		name: 'default',
		url: '/signin/oidc',
		least: null,
		body: { redirectTo: '/' },
		allowed: { type: 'redirect', status: 302 }
	},
	{
		file: 'signout/+page.server.ts',
		name: 'default',
		url: '/signout',
		least: null,
		body: {},
		allowed: { type: 'redirect', status: 302 },
		endsSession: true
	},
	{
		file: 'calc/titration/+page.server.ts',
		name: 'default',
		url: '/calc/titration',
		least: null,
		body: { points: '' },
		allowed: invalid
	},
	{
		file: 'calc/tunnelling/+page.server.ts',
		name: 'default',
		url: '/calc/tunnelling',
		least: null,
		body: { imagFreqCm1: '900' },
		allowed: { type: 'success', status: 200 }
	},
	{
		file: 'api/v1/calc/titration/+server.ts',
		name: 'POST',
		url: '/api/v1/calc/titration',
		least: null,
		body: { json: { points: [] } },
		allowed: { status: 400, code: 'bad_request' }
	},
	{
		file: 'api/v1/calc/tunnelling/+server.ts',
		name: 'POST',
		url: '/api/v1/calc/tunnelling',
		least: null,
		body: { json: { imagFreqCm1: 900 } },
		allowed: { status: 200 }
	},
	{
		file: 'api/v1/submissions/+server.ts',
		name: 'POST',
		url: '/api/v1/submissions',
		least: 'contributor',
		body: { json: {} },
		allowed: { status: 400, code: 'bad_request' }
	},
	{
		file: 'api/v1/submissions/[id=id]/attachments/+server.ts',
		name: 'POST',
		url: '/api/v1/submissions/999999/attachments',
		least: 'contributor',
		body: { json: {} },
		allowed: { status: 404, code: 'not_found' }
	},
	{
		file: 'api/v1/submissions/[id=id]/attachments/[attachmentId=id]/+server.ts',
		name: 'DELETE',
		url: '/api/v1/submissions/999999/attachments/1',
		least: 'contributor',
		body: { json: {} },
		allowed: { status: 404, code: 'not_found' }
	},
	{
		file: 'api/v1/[...rest]/+server.ts',
		name: 'fallback',
		url: '/api/v1/nothing-here',
		least: null,
		body: { json: {} },
		allowed: { status: 404, code: 'not_found' }
	},
	{
		file: '(admin)/admin/users/+page.server.ts',
		name: 'role',
		url: '/admin/users?/role',
		least: 'admin',
		body: { userId: 'no-such-user', role: 'reader' },
		allowed: invalid
	},
	{
		file: '(admin)/admin/users/+page.server.ts',
		name: 'disabled',
		url: '/admin/users?/disabled',
		least: 'admin',
		body: { userId: 'no-such-user', disabled: 'false' },
		allowed: invalid
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'create',
		url: '/admin/groups?/create',
		least: 'admin',
		body: { name: 'x', slug: 'Not A Slug' },
		allowed: invalid
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'add',
		url: '/admin/groups?/add',
		least: 'admin',
		body: { groupId: '999999', email: 'nobody@example.test' },
		allowed: invalid
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'remove',
		url: '/admin/groups?/remove',
		least: 'admin',
		body: { groupId: '999999', userId: 'no-such-user' },
		allowed: invalid
	},
	// Curation: harmless bodies (empty forms, unknown submissions) that pass the guard and fail after it.
	...(['save', 'submit', 'check', 'lookup'] as const).map((name) => ({
		file: '(app)/submissions/new/[kind=kind]/+page.server.ts',
		name,
		url: `/submissions/new/potential?/${name}`,
		least: 'contributor' as const,
		body: {},
		allowed: invalid
	})),
	...(
		['save', 'submit', 'check', 'lookup', 'withdraw', 'comment', 'attach', 'detach'] as const
	).map((name) => ({
		file: '(app)/submissions/[id=id]/+page.server.ts',
		name,
		url: `/submissions/999999?/${name}`,
		least: 'contributor' as const,
		body: {},
		// An unknown submission is looked up before anything else; a lookup, a comment and the
		// file to remove are read first.
		allowed: name === 'lookup' || name === 'comment' || name === 'detach' ? invalid : noSubmission
	})),
	...(['decide', 'batch', 'comment'] as const).map((name) => ({
		file: '(curation)/review/[id=id]/+page.server.ts',
		name,
		url: `/review/999999?/${name}`,
		least: 'curator' as const,
		// A batch's decision names what it decides; approving reaches the submission's look-up.
		body: (name === 'batch' ? { decision: 'approve' } : {}) as Record<string, string>,
		allowed: name === 'batch' ? noSubmission : invalid
	})),
	...(['check', 'commit'] as const).map((name) => ({
		file: '(app)/submissions/upload/+page.server.ts',
		name,
		url: `/submissions/upload?/${name}`,
		least: 'contributor' as const,
		body: { kind: 'potential' },
		allowed: invalid
	})),
	// No such protein: past the role check, the answer is the 404 of an unknown protein.
	...(['read', 'plan', 'submit'] as const).map((name) => ({
		file: '(app)/submissions/upload/structure/+page.server.ts',
		name,
		url: `/submissions/upload/structure?protein=HL999999&/${name}`,
		least: 'contributor' as const,
		body: { structureId: 'x' },
		allowed: { type: 'error', status: 404, message: 'no protein HL999999' } as Answer
	})),
	{
		file: 'api/v1/uploads/check/+server.ts',
		name: 'POST',
		url: '/api/v1/uploads/check',
		least: 'contributor',
		body: { json: {} },
		allowed: { status: 400, code: 'bad_request' }
	},
	{
		file: 'access/+page.server.ts',
		name: 'request',
		url: '/access?/request',
		least: 'reader',
		// A note longer than allowed: refused before anything is written or mailed.
		body: { message: 'x'.repeat(1001) },
		allowed: invalid
	},
	{
		file: '(admin)/admin/users/+page.server.ts',
		name: 'dismiss',
		url: '/admin/users?/dismiss',
		least: 'admin',
		body: { userId: '' },
		allowed: invalid
	},
	{
		file: 'account/+page.server.ts',
		name: 'notices',
		url: '/account?/notices',
		least: 'curator',
		body: { curationNotices: 'not-a-choice' },
		allowed: invalid
	},
	{
		file: 'account/+page.server.ts',
		name: 'orcid',
		url: '/account?/orcid',
		least: 'reader',
		body: { orcid: 'not-an-orcid' },
		allowed: invalid
	},
	{
		file: 'account/+page.server.ts',
		name: 'createToken',
		url: '/account?/createToken',
		least: 'reader',
		body: { name: '', scope: 'read', expires: '' },
		allowed: invalid
	},
	{
		file: 'account/+page.server.ts',
		name: 'revokeToken',
		url: '/account?/revokeToken',
		least: 'reader',
		body: { tokenId: '999999' },
		allowed: { type: 'error', status: 404, message: 'no API token 999999 of yours in use' }
	},
	{
		file: 'account/+page.server.ts',
		name: 'signOutEverywhere',
		url: '/account?/signOutEverywhere',
		least: 'reader',
		body: {},
		allowed: { type: 'redirect', status: 302 },
		endsSession: true
	}
];
