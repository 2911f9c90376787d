import { beforeAll, describe, expect, inject, it } from 'vitest';
import { signInCookie } from '../support/session';

/**
 * The answers pages and form actions give to domain failures, over HTTP against the production
 * build: statuses and the pages' own wording, which the one error path (DEVELOPERS.md, "Errors:
 * one path") must keep as they were.
 */
const base = inject('baseUrl');
let contributor = '';
let curator = '';

beforeAll(async () => {
	contributor = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	curator = await signInCookie(base, 'curator@demo.hopline.test', 'demo-curator-pass');
});

const page = (path: string, cookie?: string) =>
	fetch(`${base}${path}`, { headers: cookie ? { cookie } : {}, redirect: 'manual' });

/** A form action posted as SvelteKit's enhanced forms do: the answer is JSON. */
async function action(path: string, cookie: string, fields: Record<string, string>) {
	const res = await fetch(`${base}${path}`, {
		method: 'POST',
		headers: {
			cookie,
			origin: base,
			'content-type': 'application/x-www-form-urlencoded',
			'x-sveltekit-action': 'true'
		},
		body: new URLSearchParams(fields),
		redirect: 'manual'
	});
	return (await res.json()) as {
		type: string;
		status: number;
		error?: { message: string };
		data?: string;
	};
}

describe('pages answer domain failures with their own wording', () => {
	it('an unknown entry: 404 "There is no entry …"', async () => {
		const res = await page('/e/HL999998');
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('There is no entry HL999998.');
	});

	it('an unknown version of an entry: 404 naming the version', async () => {
		const res = await page('/e/HL999998/v3');
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('Entry HL999998 has no version 3.');
	});

	it('comparing versions of an unknown entry: 404 naming both versions', async () => {
		const res = await page('/e/HL999998/compare?from=1&to=2');
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('Entry HL999998 has no version 1 or 2.');
	});

	it('a bad page number of a related list: 400 naming the parameter', async () => {
		const res = await page('/e/HL999998?potentials=0');
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('potentials: ');
	});

	it('a submission that is not the contributor\'s: 404 "… of yours"', async () => {
		const res = await page('/submissions/999998', contributor);
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('no submission 999998 of yours');
	});

	it('a new entry of a kind that does not exist: 404 naming the kinds, for the page and its actions', async () => {
		const res = await page('/submissions/new/potentials', contributor);
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('no kind of entry "potentials"; expected one of protein');
		const posted = await action('/submissions/new/potentials?/save', contributor, { note: 'x' });
		expect(posted).toMatchObject({
			type: 'error',
			error: { message: expect.stringContaining('no kind of entry "potentials"') }
		});
	});

	it('an unknown submission in review: 404', async () => {
		const res = await page('/review/999998', curator);
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('no submission 999998');
	});
});

describe('form actions answer domain failures by code', () => {
	it('saving an unknown draft: a 404 error', async () => {
		const answer = await action('/submissions/999998?/save', contributor, { name: 'x' });
		expect(answer).toMatchObject({ type: 'error', error: { message: 'no submission 999998' } });
	});

	it('withdrawing an unknown submission: a 404 error from the service', async () => {
		const answer = await action('/submissions/999998?/withdraw', contributor, {});
		expect(answer).toMatchObject({ type: 'error', error: { message: 'no submission 999998' } });
	});

	it('an empty comment: 400 beside the comment field', async () => {
		const answer = await action('/review/999998?/comment', curator, { body: '' });
		expect(answer.type).toBe('failure');
		expect(answer.status).toBe(400);
		expect(answer.data).toContain('commentErrors');
		expect(answer.data).toContain('write a comment');
	});
});
