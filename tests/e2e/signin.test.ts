import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import { launchChromium, submitSignIn } from '../support/browser';

const base = inject('baseUrl');
let browser: Browser;
let context: BrowserContext;
let page: Page;
beforeAll(async () => {
	browser = await launchChromium();
});
afterAll(async () => browser?.close());
beforeEach(async () => {
	await context?.close();
	context = await browser.newContext({ baseURL: base });
	page = await context.newPage();
});

const signIn = (email: string, password: string) => submitSignIn(page, email, password);

describe('sign-in in Chromium', () => {
	it('a demo curator signs in, sees the role, and signs out', async () => {
		await signIn('curator@demo.hopline.test', 'demo-curator-pass');
		await page.getByTestId('user-menu').waitFor();
		expect(await page.getByTestId('user-menu').textContent()).toContain('curator');
		await page.goto('/account');
		expect(await page.getByTestId('account-role').textContent()).toBe('curator');
		await page.getByRole('button', { name: 'Sign out', exact: true }).click();
		await page.waitForURL(`${base}/`);
		expect(await page.getByTestId('user-menu').count()).toBe(0);
	});
	it('"Sign out everywhere" signs out the other browser too', async () => {
		const other = await (await browser.newContext({ baseURL: base })).newPage();
		await submitSignIn(other, 'reader@demo.hopline.test', 'demo-reader-pass');
		await other.getByTestId('user-menu').waitFor();
		await signIn('reader@demo.hopline.test', 'demo-reader-pass');
		await page.getByTestId('user-menu').waitFor();
		await page.goto('/account');
		await page.getByRole('button', { name: 'Sign out everywhere' }).click();
		await page.waitForURL(/\/signin/);
		await other.reload();
		expect(await other.getByTestId('user-menu').count()).toBe(0);
		await other.context().close();
	});
	it('a wrong password gets a clear message and no session', async () => {
		await signIn('contributor@demo.hopline.test', 'not-the-password');
		expect(await page.getByTestId('signin-error').textContent()).toContain(
			'Wrong e-mail address or password'
		);
		expect(await page.getByTestId('user-menu').count()).toBe(0);
	});
	it('an account page sends a signed-out visitor to sign in and back', async () => {
		await page.goto('/account');
		expect(page.url()).toContain('/signin?redirectTo=%2Faccount');
		await page.getByLabel('E-mail').fill('reader@demo.hopline.test');
		await page.getByLabel('Password').fill('demo-reader-pass');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(`${base}/account`);
		expect(await page.getByTestId('account-role').textContent()).toBe('reader');
	});
	it('repeated failures on one account are slowed down', async () => {
		// An address with no account, so that the demo accounts stay usable for other tests.
		for (let i = 0; i < 5; i++) await signIn('guesser@demo.hopline.test', `wrong-${i}`);
		await signIn('guesser@demo.hopline.test', 'another-guess');
		expect(await page.getByTestId('signin-error').textContent()).toMatch(
			/Too many failed attempts/
		);
	});
});
