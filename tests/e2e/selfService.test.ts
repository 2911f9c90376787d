import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage, submitSignIn } from '../support/browser';
import { linkIn, readDemoMail } from '../support/demoMail';

const base = inject('baseUrl');
let browser: Browser;
let visitor: Page;
let admin: Page;

/** The link to `path` in the newest mail to `to` that has one, read as an admin would. */
async function linkFromMail(to: string, path: string): Promise<string> {
	return linkIn(await readDemoMail(admin, to, `${base}${path}`), `${base}${path}`);
}

beforeAll(async () => {
	browser = await launchChromium();
	visitor = await (await browser.newContext({ baseURL: base })).newPage();
	admin = await signedInPage(browser, base, 'admin@demo.hopline.test', 'demo-admin-pass');
});
afterAll(async () => browser?.close());

describe('sign-up and password reset by e-mail', () => {
	const email = 'new.researcher@demo.hopline.test';
	it('refuses a mismatched password with a message beside the field', async () => {
		await visitor.goto('/signup');
		await visitor.getByLabel('Name').fill('New Researcher');
		await visitor.getByLabel('E-mail').fill(email);
		await visitor.getByLabel('Password (at least 10 characters)').fill('first-password-1');
		await visitor.getByLabel('Password again').fill('second-password-2');
		await visitor.getByRole('button', { name: 'Create account' }).click();
		expect(await visitor.locator('[data-field-error=confirm]').textContent()).toContain('differ');
	});
	it('signs up, cannot sign in before confirming, confirms by the mailed link, then signs in', async () => {
		await visitor.goto('/signup');
		await visitor.getByLabel('Name').fill('New Researcher');
		await visitor.getByLabel('E-mail').fill(email);
		await visitor.getByLabel('Password (at least 10 characters)').fill('first-password-1');
		await visitor.getByLabel('Password again').fill('first-password-1');
		await visitor.getByRole('button', { name: 'Create account' }).click();
		await visitor.getByTestId('signup-sent').waitFor();

		await submitSignIn(visitor, email, 'first-password-1');
		expect(await visitor.getByTestId('signin-error').textContent()).toContain(
			'Confirm your e-mail address'
		);

		const link = await linkFromMail(email, '/verify');
		await visitor.goto(link);
		expect(await visitor.getByTestId('verify-result').textContent()).toContain('Address confirmed');
		await visitor.goto(link);
		expect(await visitor.getByTestId('verify-result').textContent()).toContain('does not work');

		await submitSignIn(visitor, email, 'first-password-1');
		await visitor.getByTestId('user-menu').waitFor();
		expect(await visitor.getByTestId('user-menu').textContent()).toContain('reader');
	});
	it('resets a forgotten password through the mailed link, once', async () => {
		const other = await (await browser.newContext({ baseURL: base })).newPage();
		await other.goto('/reset');
		await other.getByLabel('E-mail').fill(email);
		await other.getByRole('button', { name: 'Send a reset link' }).click();
		await other.getByTestId('reset-sent').waitFor();

		const link = await linkFromMail(email, '/reset/');
		await other.goto(link);
		await other.getByLabel('New password (at least 10 characters)').fill('second-password-2');
		await other.getByLabel('Again').fill('second-password-2');
		await other.getByRole('button', { name: 'Set password' }).click();
		await other.getByTestId('reset-done').waitFor();

		await submitSignIn(other, email, 'second-password-2');
		await other.getByTestId('user-menu').waitFor();

		const again = await (await browser.newContext({ baseURL: base })).newPage();
		// A used link says so at once, with no password form.
		await again.goto(link);
		expect(await again.getByTestId('reset-link-dead').textContent()).toContain('does not work');
		expect(await again.getByLabel('Again').count()).toBe(0);
	});
});
