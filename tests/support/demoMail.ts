import type { Page } from 'playwright-core';

/**
 * The newest message to `to` (whose text matches `about`, when given) in the demo mailbox, read
 * at /admin/mail by a page signed in as an admin, as a person would. Mail leaves after the
 * answer (a reset or sign-up page must not take longer for a known address), so the page is
 * reloaded until the message is there, for up to 10 s.
 */
export async function readDemoMail(
	admin: Page,
	to: string,
	about?: string | RegExp
): Promise<string> {
	const deadline = Date.now() + 10_000;
	for (;;) {
		await admin.goto('/admin/mail');
		let message = admin.locator('[data-testid=mail-message]', { hasText: to });
		if (about) message = message.filter({ hasText: about });
		if ((await message.count()) > 0) return (await message.first().textContent()) ?? '';
		if (Date.now() > deadline)
			throw new Error(`no mail to ${to}${about ? ` about ${String(about)}` : ''} within 10 s`);
		await admin.waitForTimeout(200);
	}
}

/** The first link in `text` that starts with `prefix`. @throws when there is none. */
export function linkIn(text: string, prefix: string): string {
	const link = new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}[^\\s]+`).exec(
		text
	)?.[0];
	if (!link) throw new Error(`no ${prefix} link in: ${text}`);
	return link;
}
