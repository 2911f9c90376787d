import { chromium, type Browser, type BrowserContextOptions, type Page } from 'playwright-core';

/** Debian's Chromium, headless, with the flags this machine needs (no network but loopback). */
export function launchChromium(): Promise<Browser> {
	return chromium.launch({
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		headless: true,
		args: [
			'--no-sandbox',
			'--disable-gpu',
			'--disable-quic',
			'--no-first-run',
			'--disable-background-networking',
			'--disable-component-update',
			'--disable-sync'
		]
	});
}

/** Fills and sends the sign-in form as a person would (the outcome is the caller's to check). */
export async function submitSignIn(page: Page, email: string, password: string): Promise<void> {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
}

/** A fresh browser context signed in as the account, its page ready. */
export async function signedInPage(
	browser: Browser,
	baseURL: string,
	email: string,
	password: string,
	options: BrowserContextOptions = {}
): Promise<Page> {
	const page = await (await browser.newContext({ baseURL, ...options })).newPage();
	await submitSignIn(page, email, password);
	await page.getByTestId('user-menu').waitFor();
	return page;
}
