import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import { FakeSmtp } from './fakeSmtp';

/*
 * Outgoing mail through Nodemailer over SMTP. With SMTP_URL unset in demo mode, mail goes to a
 * local fake SMTP server (started on first use) whose messages admins can read at /admin/mail.
 */

let transport: Transporter | null = null;
let fake: FakeSmtp | null = null;

export class MailUnavailableError extends Error {
	constructor() {
		super('E-mail is not configured on this server (SMTP_URL).');
		this.name = 'MailUnavailableError';
	}
}

/** The demo's fake mailbox, or null outside demo mode. */
export async function demoMailbox(): Promise<FakeSmtp | null> {
	if (!config.HOPLINE_DEMO || config.SMTP_URL) return null;
	if (!fake) {
		const box = new FakeSmtp();
		await box.listen(config.FAKE_SMTP_PORT);
		// adapter-node's graceful shutdown waits for open servers: close the fake with it.
		process.once('sveltekit:shutdown', () => void box.close());
		fake = box;
	}
	return fake;
}

async function getTransport(): Promise<Transporter> {
	if (transport) return transport;
	if (config.SMTP_URL) {
		transport = nodemailer.createTransport(config.SMTP_URL);
	} else {
		const box = await demoMailbox();
		if (!box) throw new MailUnavailableError();
		transport = nodemailer.createTransport({
			host: '127.0.0.1',
			port: box.port,
			secure: false,
			ignoreTLS: true
		});
	}
	return transport;
}

export async function sendMail(message: {
	to: string;
	subject: string;
	text: string;
}): Promise<void> {
	const t = await getTransport();
	await t.sendMail({ from: config.MAIL_FROM, ...message, textEncoding: 'base64' });
}

/**
 * Sends without making the request wait for the mail server, logging a failure. For mail whose
 * sending must not show in the answer's timing: whether a sign-in link, a reset link or an
 * "account exists" notice goes out depends on whether an account exists, and the answer must
 * not tell.
 */
export function sendMailInBackground(message: { to: string; subject: string; text: string }): void {
	sendMail(message).catch((e: unknown) =>
		console.error(`Mail to ${message.to} ("${message.subject}") failed:`, e)
	);
}
