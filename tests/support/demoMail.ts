import type { Page } from 'playwright-core';

/**
 * The newest message to `to` (whose text matches `about`, when given) in the demo mailbox, read
 * at /admin/mail by a page signed in as an admin, as a person would.
 */
export async function readDemoMail(
	admin: Page,
	to: string,
	about?: string | RegExp
): Promise<string> {
	await admin.goto('/admin/mail');
	let message = admin.locator('[data-testid=mail-message]', { hasText: to });
	if (about) message = message.filter({ hasText: about });
	await message.first().waitFor({ timeout: 10_000 });
	return (await message.first().textContent()) ?? '';
}

/** The first link in `text` that starts with `prefix`. @throws when there is none. */
export function linkIn(text: string, prefix: string): string {
	const link = new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}[^\\s]+`).exec(
		text
	)?.[0];
	if (!link) throw new Error(`no ${prefix} link in: ${text}`);
	return link;
}
