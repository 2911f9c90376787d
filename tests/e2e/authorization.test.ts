import { beforeAll, describe, expect, inject, it } from 'vitest';
import { ROLES } from '$lib/server/auth/roles';
import type { Role } from '$lib/server/db/schema';
import accounts from '../../seed/demoAccounts.json';
import { MUTATIONS, type Answer, type Mutation } from '../support/mutations';
import { signInCookie } from '../support/session';

// Every mutating route × (signed out, reader, contributor, curator, admin), from one table.
const base = inject('baseUrl');
const cookies = new Map<Role, string>();

beforeAll(async () => {
	for (const a of accounts)
		cookies.set(a.role as Role, await signInCookie(base, a.email, a.password));
});

type Refusal = 'sign-in required' | 'forbidden';

/** What the server answered, in the terms of the table (see Answer in tests/support/mutations.ts). */
async function attempt(m: Mutation, role: Role | null): Promise<Answer | Refusal> {
	const headers: Record<string, string> = { origin: base };
	if (role) headers.cookie = cookies.get(role)!;
	const isJson = 'json' in m.body;
	if (isJson) headers['content-type'] = 'application/json';
	else {
		headers['content-type'] = 'application/x-www-form-urlencoded';
		headers['x-sveltekit-action'] = 'true';
	}
	const res = await fetch(base + m.url, {
		method: m.name === 'fallback' ? 'POST' : isJson ? m.name : 'POST',
		headers,
		body: isJson
			? JSON.stringify((m.body as { json: unknown }).json)
			: new URLSearchParams(m.body as Record<string, string>),
		redirect: 'manual'
	});
	if (res.status === 401) return 'sign-in required';
	if (res.status === 403) return 'forbidden';
	if (isJson) {
		const body = (await res.json()) as { error?: { code?: string } };
		return body.error ? { status: res.status, code: body.error.code } : { status: res.status };
	}
	const body = (await res.json()) as {
		type: NonNullable<Answer['type']>;
		status?: number;
		location?: string;
		error?: { message?: string };
	};
	if (body.type === 'redirect' && body.location?.startsWith('/signin')) return 'sign-in required';
	if (body.type === 'error' && res.status === 403) return 'forbidden';
	if (body.type === 'error')
		return { type: 'error', status: res.status, message: body.error?.message };
	return { type: body.type, status: body.status ?? res.status };
}

function expected(m: Mutation, role: Role | null): Answer | Refusal {
	if (m.least === null) return m.allowed;
	if (role === null) return 'sign-in required';
	return ROLES.indexOf(role) >= ROLES.indexOf(m.least) ? m.allowed : 'forbidden';
}

const label = (e: Answer | Refusal) =>
	typeof e === 'string' ? e : `allowed (${[e.type, e.status, e.code].filter(Boolean).join(' ')})`;

describe('authorization matrix', () => {
	for (const m of MUTATIONS) {
		for (const role of [null, ...ROLES] as (Role | null)[]) {
			const want = expected(m, role);
			it(`${m.url} (${m.name}) as ${role ?? 'signed out'} → ${label(want)}`, async () => {
				expect(await attempt(m, role)).toEqual(want);
				// Signing out ends the session on the server: the next attempts need a new one.
				if (m.endsSession && role) {
					const a = accounts.find((x) => x.role === role)!;
					cookies.set(role, await signInCookie(base, a.email, a.password));
				}
			});
		}
	}
});
