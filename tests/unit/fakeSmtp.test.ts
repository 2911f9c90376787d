import MailComposer from 'nodemailer/lib/mail-composer';
import { describe, expect, it } from 'vitest';
import { parseMessage } from '$lib/server/mail/fakeSmtp';

// RFC 2045 §6.7 (quoted-printable) and §6.8 (base64) bodies, RFC 2047 encoded-word subjects.
// The expected texts are the texts given to Nodemailer (the sender Hopline uses) or written in
// the raw message by hand.

/** The message as Nodemailer puts it on the wire. */
async function composed(
	subject: string,
	text: string,
	textEncoding: 'base64' | 'quoted-printable'
): Promise<Buffer> {
	return new MailComposer({ from: 'a@x.test', to: 'b@y.test', subject, text, textEncoding })
		.compile()
		.build();
}

describe('the SMTP fake reads messages as Hopline sends them', () => {
	it('decodes a base64 body', async () => {
		const raw = [
			'Subject: Hello',
			'Content-Transfer-Encoding: base64',
			'',
			Buffer.from('Grüße, line 1\nline 2').toString('base64')
		].join('\r\n');
		expect((await parseMessage(raw)).text).toBe('Grüße, line 1\nline 2');
	});
	it('decodes quoted-printable with soft line breaks', async () => {
		const raw = [
			'Content-Transfer-Encoding: quoted-printable',
			'',
			'https://example.test/verify?token=3Dabc=\r\ndef =C3=A9'
		].join('\r\n');
		expect((await parseMessage(raw)).text).toBe('https://example.test/verify?token=abcdef é');
	});
	it('unfolds headers', async () => {
		const raw = ['Subject: a long', ' subject line', '', 'body'].join('\r\n');
		expect((await parseMessage(raw)).subject).toBe('a long subject line');
	});

	// Regression: the hand-written decoder kept the folding space between the encoded words of a
	// long subject ("…sign-in li nk…") and garbled a quoted-printable "café" next to a "%".
	const subject =
		'Café au lait: your sign-in link for the registry of redox centres — please confirm the address within one day, café';
	const text = 'Bonjour, café 100% ok\nhttps://example.test/verify?token=abc';
	for (const encoding of ['base64', 'quoted-printable'] as const) {
		it(`reads a long encoded subject and a body with "café" (${encoding})`, async () => {
			const raw = await composed(subject, text, encoding);
			// The subject really is split into several encoded words on folded lines.
			expect(raw.toString('utf8')).toMatch(/^Subject: =\?UTF-8\?[BQ]\?.*\?=\r\n =\?UTF-8\?/m);
			expect(await parseMessage(raw)).toEqual({ subject, text });
		});
	}
	it('reads a Latin-1 quoted-printable message', async () => {
		const raw = [
			'Subject: =?ISO-8859-1?Q?caf=E9?=',
			'Content-Type: text/plain; charset=ISO-8859-1',
			'Content-Transfer-Encoding: quoted-printable',
			'',
			'un caf=E9'
		].join('\r\n');
		expect(await parseMessage(raw)).toEqual({ subject: 'café', text: 'un café' });
	});
});
