import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import { expectApiError } from '../support/apiErrors';
import { createTokenOnAccount } from '../support/apiTokens';
import { launchChromium, signedInPage } from '../support/browser';
import { buildHiddenFixtures, OUTSIDERS, type HiddenFixtures } from '../support/hiddenFixtures';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/**
 * Personal API tokens over HTTP against the production build: made on /account (with and
 * without JavaScript), reading with the owner's group visibility, submitting without cookie or
 * Origin, every refusal in the API's error shape, the per-token rate limit, and no token in the
 * server's output or the audit log. This file runs its own server: on a catalogue with entries
 * only the demo consortium may see, and with a rate limit small enough to reach.
 */
const RATE_LIMIT = 30;
const dir = mkdtempSync(join(tmpdir(), 'hopline-api-tokens-'));
const dbPath = join(dir, 'tokens.sqlite');
let server: RunningServer;
let base: string;
let fx: HiddenFixtures;
let browser: Browser | undefined;
const cookies: Record<'member' | 'contributor' | 'outsider' | 'admin', string> = {
	member: '',
	contributor: '',
	outsider: '',
	admin: ''
};
/** Every token this file makes, for the check that none of them leaks. */
const made: string[] = [];

async function token(
	who: keyof typeof cookies,
	fields: { name: string; scope?: 'read' | 'read+submit'; expires?: string }
): Promise<string> {
	const t = await createTokenOnAccount(base, cookies[who], fields);
	made.push(t);
	return t;
}

const api = (path: string, bearer: string | null, init: RequestInit = {}) =>
	fetch(`${base}${path}`, {
		...init,
		headers: { ...(bearer ? { authorization: `Bearer ${bearer}` } : {}), ...init.headers }
	});

function sqlite(readonly = true) {
	return new Database(dbPath, { readonly, fileMustExist: true });
}

beforeAll(async () => {
	const db = openDatabase(dbPath);
	await migrateToLatest(db);
	fx = await buildHiddenFixtures(db);
	await db.destroy();
	server = await startServer(dbPath, { API_TOKEN_RATE_LIMIT: String(RATE_LIMIT) });
	base = server.baseUrl;
	cookies.member = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
	cookies.contributor = await signInCookie(
		base,
		'contributor@demo.hopline.test',
		'demo-contributor-pass'
	);
	cookies.outsider = await signInCookie(base, OUTSIDERS.reader.email, OUTSIDERS.reader.password);
	cookies.admin = await signInCookie(base, 'admin@demo.hopline.test', 'demo-admin-pass');
}, 120_000);

afterAll(async () => {
	await browser?.close();
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

describe('making a token on /account without JavaScript', () => {
	it('shows it once, then lists it by name, scope and last use', async () => {
		const t = await token('member', { name: 'shown once' });
		expect(t).toMatch(/^hlpat_[A-Za-z0-9_-]{43}$/);
		const page = await (
			await fetch(`${base}/account`, { headers: { cookie: cookies.member } })
		).text();
		expect(page).not.toContain(t);
		expect(page).toContain('shown once');
		expect(page).toMatch(/data-token="shown once"[\s\S]*?never/);
	});

	it('refuses the submit scope to a reader, beside the field', async () => {
		const res = await fetch(`${base}/account?/createToken`, {
			method: 'POST',
			headers: {
				origin: base,
				cookie: cookies.member,
				'content-type': 'application/x-www-form-urlencoded',
				'x-sveltekit-action': 'true'
			},
			body: new URLSearchParams({ name: 'too much', scope: 'read+submit', expires: '' })
		});
		const body = (await res.json()) as { type: string; status: number; data: string };
		expect(body).toMatchObject({ type: 'failure', status: 400 });
		expect(body.data).toContain('submitting needs the contributor role');
	});
});

describe('reading with a token', () => {
	it("sees what its owner's groups see, and nothing more", async () => {
		const member = await token('member', { name: 'member reads' });
		const outsider = await token('outsider', { name: 'outsider reads' });
		const path = `/api/v1/entries/${fx.hiddenPotential}`;
		expect((await api(path, member)).status).toBe(200);
		await expectApiError(await api(path, outsider), 404, 'not_found');
		await expectApiError(await api(path, null), 404, 'not_found');
	});

	it('is answered for the token alone, not for a cookie sent with it', async () => {
		const outsider = await token('outsider', { name: 'with a cookie' });
		const res = await api(`/api/v1/entries/${fx.hiddenPotential}`, outsider, {
			headers: { cookie: cookies.member }
		});
		await expectApiError(res, 404, 'not_found');
	});

	it('gives nothing on pages: they are for browsers and their sessions', async () => {
		const t = await token('member', { name: 'not for pages' });
		const res = await fetch(`${base}/account`, {
			headers: { authorization: `Bearer ${t}` },
			redirect: 'manual'
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
	});
});

describe('submitting with a token', () => {
	const submission = () => ({
		kind: 'potential',
		data: {
			centreAccession: fx.publicCentre,
			couple: fx.publicCentreCouple,
			reportedValue: -0.31,
			reportedUnit: 'V',
			referenceElectrode: 'SHE',
			method: 'solution_voltammetry'
		}
	});
	const post = (bearer: string, body: unknown) =>
		api('/api/v1/submissions', bearer, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(body)
		});
	const check = (bearer: string) => {
		const form = new FormData();
		form.set('kind', 'potential');
		form.set('file', new Blob(['centreAccession,couple,reportedValue\n']), 'f.csv');
		return api('/api/v1/uploads/check', bearer, { method: 'POST', body: form });
	};

	it('read+submit deposits and checks uploads with no cookie and no Origin', async () => {
		const t = await token('contributor', { name: 'depositor', scope: 'read+submit' });
		const res = await post(t, submission());
		expect(res.status).toBe(201);
		const { id } = (await res.json()) as { id: number };
		expect((await check(t)).status).toBe(200);
		// The submission is the token owner's: readable with the token (a read), as with the cookie.
		expect((await api(`/api/v1/submissions/${id}`, t)).status).toBe(200);
		const owner = sqlite()
			.prepare(
				'select u.email from submission s join "User" u on u.id = s.submitted_by where s.id = ?'
			)
			.pluck()
			.get(id);
		expect(owner).toBe('contributor@demo.hopline.test');
	});

	it('a read token may not submit or check uploads: 403 naming the scope', async () => {
		const t = await token('contributor', { name: 'reader only' });
		const refused = await expectApiError(await post(t, submission()), 403, 'forbidden');
		expect(refused.message).toContain('read+submit');
		await expectApiError(await check(t), 403, 'forbidden');
	});

	it("still needs the owner's role: a reader's token cannot read submissions", async () => {
		const t = await token('member', { name: 'reader role' });
		await expectApiError(await api('/api/v1/submissions/1', t), 403, 'forbidden');
	});
});

describe('refused tokens: JSON 401 with WWW-Authenticate', () => {
	async function refused(bearer: string, message: string) {
		const res = await api('/api/v1/potentials?limit=1', bearer);
		expect(res.headers.get('www-authenticate')).toBe(
			'Bearer realm="Hopline API", error="invalid_token"'
		);
		const error = await expectApiError(res, 401, 'unauthorized');
		expect(error.message).toContain(message);
		expect(error.message).not.toContain(bearer.slice(6, 20));
	}

	it('wrong or malformed', async () => {
		const t = await token('member', { name: 'to be altered' });
		await refused(t.slice(0, -1) + (t.endsWith('A') ? 'B' : 'A'), 'not valid');
		await refused('hlpat_short', 'not a Hopline API token');
		// A token under another scheme: the client got the scheme wrong. A proxy's Basic
		// credentials passed through are none of the API's business.
		const wrongScheme = await api('/api/v1/potentials', null, {
			headers: { authorization: `Token ${t}` }
		});
		const error = await expectApiError(wrongScheme, 401, 'unauthorized');
		expect(error.message).toContain('Authorization: Bearer');
		const basic = await api('/api/v1/potentials?limit=1', null, {
			headers: { authorization: 'Basic eDp5' }
		});
		expect(basic.status).toBe(200);
	});

	it('revoked on /account', async () => {
		const t = await token('member', { name: 'to be revoked' });
		expect((await api('/api/v1/facets', t)).status).toBe(200);
		const id = sqlite()
			.prepare('select id from api_token where name = ?')
			.pluck()
			.get('to be revoked') as number;
		const res = await fetch(`${base}/account?/revokeToken`, {
			method: 'POST',
			headers: {
				origin: base,
				cookie: cookies.member,
				'content-type': 'application/x-www-form-urlencoded',
				'x-sveltekit-action': 'true'
			},
			body: new URLSearchParams({ tokenId: String(id) })
		});
		expect(((await res.json()) as { type: string }).type).toBe('success');
		await refused(t, 'revoked');
	});

	it('expired', async () => {
		const inAMonth = new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10);
		const t = await token('member', { name: 'to expire', expires: inAMonth });
		expect((await api('/api/v1/facets', t)).status).toBe(200);
		const db = sqlite(false);
		db.prepare('update api_token set expires_at = ? where name = ?').run(
			'2000-01-01T00:00:00.000Z',
			'to expire'
		);
		db.close();
		await refused(t, 'expired');
	});

	it('its owner disabled by an admin', async () => {
		const t = await token('outsider', { name: 'owner disabled' });
		expect((await api('/api/v1/facets', t)).status).toBe(200);
		const userId = sqlite()
			.prepare('select id from "User" where email = ?')
			.pluck()
			.get(OUTSIDERS.reader.email) as string;
		const disable = (disabled: 'true' | 'false') =>
			fetch(`${base}/admin/users?/disabled`, {
				method: 'POST',
				headers: {
					origin: base,
					cookie: cookies.admin,
					'content-type': 'application/x-www-form-urlencoded',
					'x-sveltekit-action': 'true'
				},
				body: new URLSearchParams({ userId, disabled })
			});
		expect((await disable('true')).status).toBe(200);
		await refused(t, 'disabled');
		expect((await disable('false')).status).toBe(200);
		expect((await api('/api/v1/facets', t)).status).toBe(200);
	});
});

describe('rate limit per token', () => {
	it(`answers ${RATE_LIMIT} requests a minute, then 429 with Retry-After and RateLimit-*`, async () => {
		const t = await token('member', { name: 'busy script' });
		for (let i = 1; i <= RATE_LIMIT; i++) {
			const res = await api('/api/v1/facets', t);
			expect(res.status).toBe(200);
			expect(res.headers.get('ratelimit-limit')).toBe(String(RATE_LIMIT));
			expect(res.headers.get('ratelimit-remaining')).toBe(String(RATE_LIMIT - i));
			expect(res.headers.get('ratelimit-policy')).toBe(`${RATE_LIMIT};w=60`);
		}
		const res = await api('/api/v1/facets', t);
		const retry = Number(res.headers.get('retry-after'));
		expect(retry).toBeGreaterThanOrEqual(1);
		expect(retry).toBeLessThanOrEqual(60);
		expect(res.headers.get('ratelimit-remaining')).toBe('0');
		expect(Number(res.headers.get('ratelimit-reset'))).toBe(retry);
		const error = await expectApiError(res, 429, 'too_many_requests');
		expect(error.message).toContain(`${RATE_LIMIT} requests per 60 s`);
		// Counted per token: another token of the same person is not held back.
		const other = await token('member', { name: 'other script' });
		expect((await api('/api/v1/facets', other)).status).toBe(200);
	});
});

describe('in the browser, with JavaScript', () => {
	it('makes a token, shows it once, records its use, and revokes it', async () => {
		browser ??= await launchChromium();
		const page = await signedInPage(
			browser,
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		await page.goto('/account');
		const section = page.getByTestId('api-tokens');
		await section.getByLabel('Name').fill('browser made');
		await section.getByLabel(/read \+ submit/).check();
		await section.getByRole('button', { name: 'Create token' }).click();
		const t = (await page.getByTestId('new-token-value').textContent())!.trim();
		made.push(t);
		expect(t).toMatch(/^hlpat_/);
		const row = page.locator('[data-token="browser made"]');
		await expect.poll(() => row.textContent()).toContain('read+submit');

		expect((await api('/api/v1/facets', t)).status).toBe(200);
		// The last-used time is written beside the answer, not before it: wait for it (≤ 5 s).
		await expect
			.poll(
				async () => {
					await page.reload();
					return row.getByTestId('token-last-used').textContent();
				},
				{ timeout: 5000 }
			)
			.toMatch(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
		expect(await page.content()).not.toContain(t);

		await row.getByRole('button', { name: 'Revoke browser made' }).click();
		await expect.poll(() => row.textContent()).toContain('revoked');
		await expectApiError(await api('/api/v1/facets', t), 401, 'unauthorized');
		await page.context().close();
	});
});

describe('tokens never leave a trace', () => {
	it('none of them, nor their hashes, is in the server output or the audit log', async () => {
		expect(made.length).toBeGreaterThan(10);
		const sha = (t: string) => createHash('sha256').update(t).digest('hex');
		const output = server.output();
		const db = sqlite();
		const audit = JSON.stringify(db.prepare('select * from audit_log').all());
		const actions = db
			.prepare("select action from audit_log where action like 'account.api_token%'")
			.pluck()
			.all();
		db.close();
		// The audit log did record the tokens' lives, without them.
		expect(actions).toContain('account.api_token_create');
		expect(actions).toContain('account.api_token_revoke');
		for (const t of made) {
			for (const trace of [t, t.slice(6), sha(t)]) {
				expect(output).not.toContain(trace);
				expect(audit).not.toContain(trace);
			}
		}
	});
});
