import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';
import { linkIn, readDemoMail } from '../support/demoMail';

// Sign-in by e-mail link (read from the SMTP fake) and by OpenID Connect (the oidc-provider fake).
const base = inject('baseUrl');
let browser: Browser;
let admin: Page;

const fresh = async () => (await browser.newContext({ baseURL: base })).newPage();

beforeAll(async () => {
	browser = await launchChromium();
	admin = await signedInPage(browser, base, 'admin@demo.hopline.test', 'demo-admin-pass');
});
afterAll(async () => browser?.close());

async function signInLink(to: string): Promise<string> {
	return linkIn(await readDemoMail(admin, to, 'sign-in link'), `${base}/auth/callback/email`);
}

describe('sign-in by e-mail link', () => {
	it('mails a one-time link that signs the account in', async () => {
		const page = await fresh();
		await page.goto('/signin/link');
		await page.getByLabel('E-mail').fill('curator@demo.hopline.test');
		await page.getByRole('button', { name: 'E-mail me a link' }).click();
		await page.getByTestId('link-sent').waitFor();
		const link = await signInLink('curator@demo.hopline.test');
		await page.goto(link);
		expect(await page.getByTestId('user-menu').textContent()).toContain('curator');

		// Used once: a second visit is refused with a clear message.
		const other = await fresh();
		await other.goto(link);
		expect(await other.getByTestId('signin-failed').textContent()).toContain(
			'expired or was already used'
		);
	});
	it('answers the same for an unknown address and sends nothing', async () => {
		const page = await fresh();
		await page.goto('/signin/link');
		await page.getByLabel('E-mail').fill('nobody.here@demo.hopline.test');
		await page.getByRole('button', { name: 'E-mail me a link' }).click();
		await page.getByTestId('link-sent').waitFor();
		await admin.goto('/admin/mail');
		expect(
			await admin.locator('[data-testid=mail-message]', { hasText: 'nobody.here@' }).count()
		).toBe(0);
	});
});

describe('sign-in with OpenID Connect', () => {
	it('creates a reader account on first sign-in through the institution', async () => {
		const page = await fresh();
		await page.goto('/signin');
		await page.getByRole('button', { name: /Continue with/ }).click();
		await page.waitForURL(/\/interaction\//);
		await page.locator('input[name=login]').fill('grace.hopper@institution.demo.hopline.test');
		await page.locator('input[name=password]').fill('any password');
		await page.locator('button[type=submit]').click();
		await page.getByTestId('user-menu').waitFor();
		expect(await page.getByTestId('user-menu').textContent()).toBe('grace hopper · reader');
		await page.goto('/account');
		expect(await page.locator('dd').nth(1).textContent()).toBe(
			'grace.hopper@institution.demo.hopline.test'
		);
	});
	it('joins an existing account with the same verified address', async () => {
		const page = await fresh();
		await page.goto('/signin');
		await page.getByRole('button', { name: /Continue with/ }).click();
		await page.waitForURL(/\/interaction\//);
		await page.locator('input[name=login]').fill('contributor@demo.hopline.test');
		await page.locator('input[name=password]').fill('x');
		await page.locator('button[type=submit]').click();
		await page.getByTestId('user-menu').waitFor();
		expect(await page.getByTestId('user-menu').textContent()).toContain('contributor');
	});
});
