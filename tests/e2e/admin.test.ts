import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, signedInPage } from '../support/browser';

const base = inject('baseUrl');
let browser: Browser;
let page: Page;
beforeAll(async () => {
	browser = await launchChromium();
	page = await signedInPage(browser, base, 'admin@demo.hopline.test', 'demo-admin-pass');
});
afterAll(async () => browser?.close());

describe('administration in Chromium', () => {
	it('creates a group, adds a member, and the member list shows it', async () => {
		await page.goto('/admin/groups');
		await page.getByLabel('Name', { exact: true }).fill('Demo photosynthesis lab');
		await page.getByLabel('Short name').fill('demo-photosynthesis-lab');
		await page.getByRole('button', { name: 'Create group' }).click();
		const group = page.locator('[data-group=demo-photosynthesis-lab]');
		await group.waitFor();
		await group.getByLabel('Add by e-mail').fill('reader@demo.hopline.test');
		await group.getByRole('button', { name: 'Add' }).click();
		await group.getByText('reader@demo.hopline.test').waitFor();
		await page.goto('/admin/users');
		expect(await page.locator('[data-user="reader@demo.hopline.test"]').textContent()).toContain(
			'Demo photosynthesis lab'
		);
	});
	it('refuses a bad slug with a message beside the field', async () => {
		await page.goto('/admin/groups');
		await page.getByLabel('Name', { exact: true }).fill('Bad');
		await page.getByLabel('Short name').fill('Not A Slug!');
		await page.getByRole('button', { name: 'Create group' }).click();
		expect(await page.locator('[data-field-error=slug]').textContent()).toContain(
			'lower-case letters'
		);
	});
	it('changes a role, and refuses to demote the last admin', async () => {
		await page.goto('/admin/users');
		const contributor = page.locator('[data-user="contributor@demo.hopline.test"]');
		await contributor.locator('select').selectOption('curator');
		await contributor.getByRole('button', { name: 'Set' }).click();
		await page.getByRole('status').waitFor();
		await page.reload();
		expect(await contributor.locator('select').inputValue()).toBe('curator');
		await contributor.locator('select').selectOption('contributor');
		await contributor.getByRole('button', { name: 'Set' }).click();
		await page.getByRole('status').waitFor();

		const admin = page.locator('[data-user="admin@demo.hopline.test"]');
		await admin.locator('select').selectOption('reader');
		await admin.getByRole('button', { name: 'Set' }).click();
		expect(await page.getByTestId('admin-error').textContent()).toContain('last active admin');
	});
	it('a curator may not open the admin pages', async () => {
		const other = await signedInPage(
			browser,
			base,
			'curator@demo.hopline.test',
			'demo-curator-pass'
		);
		const res = await other.goto('/admin/users');
		expect(res?.status()).toBe(403);
		expect(await other.locator('main').textContent()).toContain('needs the admin role');
	});
});
