import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { seriousViolations } from '../support/axe';
import { launchChromium, signedInPage } from '../support/browser';
import { readDemoMail } from '../support/demoMail';

/*
 * The curation and admin screens in Chromium (issue 14 §4): names of referenced entries, one
 * decision form per batch with rows in columns, the audit log in words, the 403 page's request
 * for contributor access, why sign-in was asked, dead reset links, receipts and local times;
 * each state checked with axe (0 critical, 0 serious) and for sideways scrolling at 390 px.
 */
const base = inject('baseUrl');
let browser: Browser;
let contributor: Page;
let curator: Page;
let admin: Page;
let reader: Page;
let formId = '';
let batchId = '';
let centre = '';

const options = { bypassCSP: true };
const signedIn = (role: string) =>
	signedInPage(browser, base, `${role}@demo.hopline.test`, `demo-${role}-pass`, options);
const overflow = (page: Page) =>
	page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

/** axe on the page, then the same URL at 390 px in the same context: no sideways scroll. */
async function checkState(page: Page) {
	expect(await seriousViolations(page)).toEqual([]);
	const size = page.viewportSize();
	await page.setViewportSize({ width: 390, height: 844 });
	await page.reload();
	expect(await overflow(page)).toBe(0);
	if (size) await page.setViewportSize(size);
}

beforeAll(async () => {
	browser = await launchChromium();
	contributor = await signedIn('contributor');
	curator = await signedIn('curator');
	admin = await signedIn('admin');
	reader = await signedIn('reader');
	const res = await fetch(`${base}/api/v1/potentials?kind=fe4s4&limit=1`);
	const body = (await res.json()) as { items: { centre: { accession: string } }[] };
	centre = body.items[0]?.centre.accession ?? '';
	const created = await contributor.request.post('/api/v1/submissions', {
		headers: { origin: base },
		data: {
			kind: 'potential',
			submit: true,
			data: {
				centreAccession: centre,
				couple: '[4Fe-4S]2+/1+',
				reportedValue: 250,
				reportedUnit: 'mV',
				referenceElectrode: 'SHE',
				ph: 7.5,
				temperatureK: 298.15,
				method: 'epr_titration',
				uncertaintyMv: 10
			}
		}
	});
	formId = String(((await created.json()) as { id: number }).id);
	await contributor.goto('/submissions/upload');
	await contributor
		.locator('input[type=file]')
		.setInputFiles('tests/fixtures/csv/potentials-good.csv');
	await contributor.getByRole('button', { name: /Check/ }).first().click();
	await contributor.getByTestId('would-create').waitFor();
	await contributor.getByRole('button', { name: /Commit for review|Submit for review/ }).click();
	await contributor.waitForURL(/\/submissions\/\d+\?uploaded/);
	batchId = new URL(contributor.url()).pathname.split('/').pop() ?? '';
}, 120_000);
afterAll(async () => browser?.close());

describe('review and submission pages', () => {
	it('name the referenced centre with its accession, linked', async () => {
		await curator.goto(`/review/${formId}`);
		const ref = curator.locator(`a[data-reference="${centre}"]`).first();
		expect(await ref.getAttribute('href')).toBe(`/e/${centre}`);
		const text = (await ref.textContent()) ?? '';
		expect(text).toContain(`(${centre})`);
		expect(text.replace(`(${centre})`, '').trim().length).toBeGreaterThan(3);
		await checkState(curator);
		await contributor.goto(`/submissions/${formId}`);
		expect(await contributor.locator(`a[data-reference="${centre}"]`).count()).toBeGreaterThan(0);
		await checkState(contributor);
	});

	it('give a batch one decision form and its rows in columns', async () => {
		await curator.goto(`/review/${batchId}`);
		expect(await curator.getByTestId('decision-form').count()).toBe(1);
		expect(await curator.getByRole('button', { name: 'Approve the other rows' }).count()).toBe(0);
		const headers = await curator.locator('[data-testid=batch-rows] thead th').allTextContents();
		expect(headers.map((h) => h.trim())).toEqual(
			expect.arrayContaining(['Row', 'Entry', 'Centre', 'Couple', 'pH', 'Method', 'Status'])
		);
		// Each value in its own cell; the centre named where the reader may see it.
		expect(await curator.locator('[data-testid=batch-rows] td[data-column=ph]').count()).toBe(3);
		expect(
			await curator.locator('[data-testid=batch-rows] a[data-reference]').count()
		).toBeGreaterThan(0);
		await checkState(curator);
		// Returning the whole file needs a comment, said beside the field.
		await curator.getByLabel('Return the whole file for changes').check();
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.locator('[data-field-error=comment]').waitFor();
		// Approving with a row sent back.
		await curator.getByLabel('Approve (except any rows listed below)').check();
		await curator.locator('[name=returnRows]').fill('3');
		await curator.locator('[name=comment]').fill('Row 3: which buffer?');
		await curator.getByRole('button', { name: 'Record decision' }).click();
		await curator.getByTestId('batch-done').waitFor();
		expect(await curator.getByTestId('batch-done').textContent()).toContain(
			'2 row(s) approved, 1 returned'
		);
	});
});

describe('the audit log', () => {
	it('says what happened in words, with names and differences, newest first', async () => {
		await curator.goto(`/audit?submission=${batchId}`);
		const rows = curator.locator('[data-testid=audit-log] tbody tr');
		const actions = await rows.evaluateAll((trs) => trs.map((t) => t.getAttribute('data-action')));
		expect(actions).toEqual(['review.batch', 'submission.upload']);
		const text = (await curator.getByTestId('audit-log').textContent()) ?? '';
		expect(text).toContain(`decided on submission #${batchId}: 2 rows approved, 1 returned`);
		expect(text).toContain('Demo Curator');
		expect(text).not.toMatch(/"status"|review\.batch/);
		await curator.goto('/audit');
		const times = await curator
			.locator('[data-testid=audit-log] time')
			.evaluateAll((ts) => ts.map((t) => t.getAttribute('datetime') ?? ''));
		expect(times.length).toBeGreaterThan(10);
		expect([...times].sort().reverse()).toEqual(times);
		// Shown in the reader's zone once the page runs, UTC in the title.
		await curator.locator('[data-testid=audit-log] time[data-local=true]').first().waitFor();
		expect(
			await curator.locator('[data-testid=audit-log] time').first().getAttribute('title')
		).toMatch(/UTC$/);
		await curator.getByLabel('Action').selectOption('review');
		await curator.getByRole('button', { name: 'Filter' }).click();
		await curator.waitForURL(/action=review/);
		const filtered = await curator
			.locator('[data-testid=audit-log] tbody tr')
			.evaluateAll((trs) => trs.map((t) => t.getAttribute('data-action') ?? ''));
		expect(filtered.every((a) => a.startsWith('review.'))).toBe(true);
		await checkState(curator);
		await curator.goto('/audit?from=2031-02-01&to=2031-01-01');
		expect(await curator.locator('body').textContent()).toContain(
			'the end date comes before the start date'
		);
	});
});

describe('roles and access', () => {
	it('says which role a page needs, and lets a reader ask for it', async () => {
		const res = await reader.goto('/submissions/new/potential');
		expect(res?.status()).toBe(403);
		expect(await reader.locator('h1').textContent()).toContain('needs the contributor role');
		expect(await reader.getByTestId('role-needed').textContent()).toContain('administrators');
		await checkState(reader);
		await reader.getByRole('button', { name: 'Request contributor access' }).click();
		await reader.getByTestId('access-requested').waitFor();
		await reader.goto('/access');
		await reader.getByTestId('access-open').waitFor();
		await checkState(reader);

		const mail = await readDemoMail(admin, 'admin@demo.hopline.test', /contributor access/);
		expect(mail).toContain('Demo Reader');
		await admin.goto('/admin/users');
		const request = admin.locator('[data-request="reader@demo.hopline.test"]');
		expect(await request.count()).toBe(1);
		await checkState(admin);
		await request.getByRole('button', { name: 'Dismiss' }).click();
		await admin.getByRole('status').filter({ hasText: 'dismissed' }).waitFor();
		expect(await admin.getByRole('status').first().textContent()).toContain(
			'Request of Demo Reader for contributor access dismissed.'
		);
	});

	it('names the person whose role an admin changes', async () => {
		await admin.goto('/admin/users');
		const row = admin.locator('[data-user="reader@demo.hopline.test"]');
		await row.locator('select[name=role]').selectOption('reader');
		await row.getByRole('button', { name: 'Set' }).click();
		await admin.getByRole('status').filter({ hasText: 'Demo Reader' }).waitFor();
		expect(await admin.getByRole('status').first().textContent()).toContain(
			'Demo Reader has the reader role already.'
		);
	});

	it('tells a signed-out visitor why they must sign in, from known pages only', async () => {
		const visitor = await (await browser.newContext({ baseURL: base, ...options })).newPage();
		await visitor.goto('/submissions/new/potential');
		await visitor.waitForURL(/\/signin\?redirectTo=/);
		expect(await visitor.getByTestId('signin-reason').textContent()).toContain(
			'Sign in to submit entries.'
		);
		await checkState(visitor);
		await visitor.goto('/signin?redirectTo=%2Fsearch%3Fq%3DSign%20in%20to%20win');
		expect(await visitor.getByTestId('signin-reason').count()).toBe(0);
		await visitor.goto('/signup');
		expect(await visitor.getByTestId('signup-roles').textContent()).toContain('administrators');
		await checkState(visitor);
		// A dead reset link says so, with no password form.
		await visitor.goto('/reset/aaaaaaaaaaaaaaaaaaaaaaaaaaaaaa');
		expect(await visitor.getByTestId('reset-link-dead').textContent()).toContain('does not work');
		expect(await visitor.locator('input[type=password]').count()).toBe(0);
		expect(await visitor.getByRole('link', { name: 'Ask for a new link' }).count()).toBe(1);
		await checkState(visitor);
	});
});

describe('mail', () => {
	it('sends the contributor a receipt and shows the mailbox in local time', async () => {
		const receipt = await readDemoMail(
			admin,
			'contributor@demo.hopline.test',
			new RegExp(`Received: submission #${formId}`)
		);
		expect(receipt).toContain('outside the typical range');
		const notice = await readDemoMail(
			admin,
			'curator@demo.hopline.test',
			new RegExp(`New submission #${batchId}`)
		);
		expect(notice).toMatch(/No warnings\.|Warnings: /);
		await admin.locator('[data-testid=mail-message] time[data-local=true]').first().waitFor();
		await checkState(admin);
	});
});
