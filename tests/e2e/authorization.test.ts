import { beforeAll, describe, expect, inject, it } from 'vitest';
import { ROLES } from '$lib/server/auth/roles';
import type { Role } from '$lib/server/db/schema';
import accounts from '../../seed/demoAccounts.json';
import { MUTATIONS, type Mutation } from '../support/mutations';
import { signInCookie } from '../support/session';

// Every mutating route × (signed out, reader, contributor, curator, admin), from one table.
const base = inject('baseUrl');
const cookies = new Map<Role, string>();

beforeAll(async () => {
	for (const a of accounts)
		cookies.set(a.role as Role, await signInCookie(base, a.email, a.password));
});

type Outcome = 'allowed' | 'sign-in required' | 'forbidden';

async function attempt(m: Mutation, role: Role | null): Promise<Outcome> {
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
	if (!isJson) {
		const body = (await res.json()) as { type: string; status?: number; location?: string };
		if (body.type === 'redirect' && body.location?.startsWith('/signin')) return 'sign-in required';
		if (body.type === 'error' && body.status === 403) return 'forbidden';
	}
	return 'allowed';
}

function expected(m: Mutation, role: Role | null): Outcome {
	if (m.least === null) return 'allowed';
	if (role === null) return 'sign-in required';
	return ROLES.indexOf(role) >= ROLES.indexOf(m.least) ? 'allowed' : 'forbidden';
}

describe('authorization matrix', () => {
	for (const m of MUTATIONS) {
		for (const role of [null, ...ROLES] as (Role | null)[]) {
			it(`${m.url} (${m.name}) as ${role ?? 'signed out'} → ${expected(m, role)}`, async () => {
				expect(await attempt(m, role)).toBe(expected(m, role));
				// Signing out ends the session on the server: the next attempts need a new one.
				if (m.endsSession && role) {
					const a = accounts.find((x) => x.role === role)!;
					cookies.set(role, await signInCookie(base, a.email, a.password));
				}
			});
		}
	}
});
