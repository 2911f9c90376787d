import { sendMail } from '../mail/mailer';

/*
 * Mail decided inside a transaction is sent only after it commits: services return the
 * messages, routes deliver them. A failed delivery is logged and never undoes the change.
 */
export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
}

export async function deliver(mails: readonly OutgoingMail[]): Promise<number> {
	let sent = 0;
	for (const mail of mails) {
		try {
			await sendMail(mail);
			sent++;
		} catch (e) {
			console.error(`Could not send "${mail.subject}" to ${mail.to}:`, e);
		}
	}
	return sent;
}
