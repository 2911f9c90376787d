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
	/** Ends the caller's session(s) when allowed: the matrix signs in again after trying it. */
	endsSession?: true;
}

export const MUTATIONS: Mutation[] = [
	{
		file: 'signin/+page.server.ts',
		name: 'default',
		url: '/signin',
		least: null,
		body: { email: 'nobody@example.test', password: 'x' }
	},
	{
		file: 'signup/+page.server.ts',
		name: 'default',
		url: '/signup',
		least: null,
		body: { name: 'x', email: 'not-an-address', password: 'short', confirm: 'other' }
	},
	{
		file: 'reset/+page.server.ts',
		name: 'default',
		url: '/reset',
		least: null,
		body: { email: 'not-an-address' }
	},
	{
		file: 'reset/[token]/+page.server.ts',
		name: 'default',
		url: '/reset/not-a-real-token-value-xx',
		least: null,
		body: { password: 'short', confirm: 'x' }
	},
	{
		file: 'signin/link/+page.server.ts',
		name: 'default',
		url: '/signin/link',
		least: null,
		body: { email: 'not-an-address' }
	},
	{
		file: 'signin/oidc/+page.server.ts',
		name: 'default',
		url: '/signin/oidc',
		least: null,
		body: { redirectTo: '/' }
	},
	{
		file: 'signout/+page.server.ts',
		name: 'default',
		url: '/signout',
		least: null,
		body: {},
		endsSession: true
	},
	{
		file: 'calc/titration/+page.server.ts',
		name: 'default',
		url: '/calc/titration',
		least: null,
		body: { points: '' }
	},
	{
		file: 'calc/tunnelling/+page.server.ts',
		name: 'default',
		url: '/calc/tunnelling',
		least: null,
		body: { imagFreqCm1: '900' }
	},
	{
		file: 'api/v1/calc/titration/+server.ts',
		name: 'POST',
		url: '/api/v1/calc/titration',
		least: null,
		body: { json: { points: [] } }
	},
	{
		file: 'api/v1/calc/tunnelling/+server.ts',
		name: 'POST',
		url: '/api/v1/calc/tunnelling',
		least: null,
		body: { json: { imagFreqCm1: 900 } }
	},
	{
		file: 'api/v1/submissions/+server.ts',
		name: 'POST',
		url: '/api/v1/submissions',
		least: 'contributor',
		body: { json: {} }
	},
	{
		file: 'api/v1/[...rest]/+server.ts',
		name: 'fallback',
		url: '/api/v1/nothing-here',
		least: null,
		body: { json: {} }
	},
	{
		file: '(admin)/admin/users/+page.server.ts',
		name: 'role',
		url: '/admin/users?/role',
		least: 'admin',
		body: { userId: 'no-such-user', role: 'reader' }
	},
	{
		file: '(admin)/admin/users/+page.server.ts',
		name: 'disabled',
		url: '/admin/users?/disabled',
		least: 'admin',
		body: { userId: 'no-such-user', disabled: 'false' }
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'create',
		url: '/admin/groups?/create',
		least: 'admin',
		body: { name: 'x', slug: 'Not A Slug' }
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'add',
		url: '/admin/groups?/add',
		least: 'admin',
		body: { groupId: '999999', email: 'nobody@example.test' }
	},
	{
		file: '(admin)/admin/groups/+page.server.ts',
		name: 'remove',
		url: '/admin/groups?/remove',
		least: 'admin',
		body: { groupId: '999999', userId: 'no-such-user' }
	},
	// Curation: harmless bodies (empty forms, unknown submissions) that pass the guard and fail after it.
	...(['save', 'submit', 'lookup'] as const).map((name) => ({
		file: '(app)/submissions/new/[kind=kind]/+page.server.ts',
		name,
		url: `/submissions/new/potential?/${name}`,
		least: 'contributor' as const,
		body: {}
	})),
	...(['save', 'submit', 'lookup', 'withdraw', 'comment'] as const).map((name) => ({
		file: '(app)/submissions/[id=id]/+page.server.ts',
		name,
		url: `/submissions/999999?/${name}`,
		least: 'contributor' as const,
		body: {}
	})),
	...(['decide', 'batch', 'comment'] as const).map((name) => ({
		file: '(curation)/review/[id=id]/+page.server.ts',
		name,
		url: `/review/999999?/${name}`,
		least: 'curator' as const,
		body: {}
	})),
	...(['check', 'commit'] as const).map((name) => ({
		file: '(app)/submissions/upload/+page.server.ts',
		name,
		url: `/submissions/upload?/${name}`,
		least: 'contributor' as const,
		body: { kind: 'potential' }
	})),
	{
		file: 'api/v1/uploads/check/+server.ts',
		name: 'POST',
		url: '/api/v1/uploads/check',
		least: 'contributor',
		body: { json: {} }
	},
	{
		file: 'account/+page.server.ts',
		name: 'notices',
		url: '/account?/notices',
		least: 'curator',
		body: { curationNotices: 'not-a-choice' }
	},
	{
		file: 'account/+page.server.ts',
		name: 'signOutEverywhere',
		url: '/account?/signOutEverywhere',
		least: 'reader',
		body: {},
		endsSession: true
	}
];
