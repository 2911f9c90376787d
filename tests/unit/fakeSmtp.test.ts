import { describe, expect, it } from 'vitest';
import { parseMessage } from '$lib/server/mail/fakeSmtp';

// RFC 2045 §6.7 (quoted-printable) and §6.8 (base64) bodies, RFC 2047 encoded-word subjects.
describe('the SMTP fake reads messages as Hopline sends them', () => {
	it('decodes a base64 body', () => {
		const raw = [
			'Subject: Hello',
			'Content-Transfer-Encoding: base64',
			'',
			Buffer.from('Grüße, line 1\nline 2').toString('base64')
		].join('\r\n');
		expect(parseMessage(raw).text).toBe('Grüße, line 1\nline 2');
	});
	it('decodes quoted-printable with soft line breaks', () => {
		const raw = [
			'Content-Transfer-Encoding: quoted-printable',
			'',
			'https://example.test/verify?token=3Dabc=\r\ndef =C3=A9'
		].join('\r\n');
		expect(parseMessage(raw).text).toBe('https://example.test/verify?token=abcdef é');
	});
	it('unfolds headers', () => {
		const raw = ['Subject: a long', ' subject line', '', 'body'].join('\r\n');
		expect(parseMessage(raw).headers.get('subject')).toBe('a long subject line');
	});
});
