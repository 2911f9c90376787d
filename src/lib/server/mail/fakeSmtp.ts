import { SMTPServer } from 'smtp-server';

/**
 * A local SMTP server that keeps what it receives, for the demo and the tests: mail never leaves
 * the machine, and admins can read it at /admin/mail in demo mode. Accepts plain-text messages
 * (as Hopline sends them: base64 or quoted-printable bodies, RFC 2047 subjects).
 */

export interface KeptMessage {
	id: number;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
}

const KEEP = 500;

function decodeWords(value: string): string {
	return value.replace(/=\?utf-8\?([bq])\?([^?]*)\?=/gi, (_, enc: string, text: string) =>
		enc.toLowerCase() === 'b'
			? Buffer.from(text, 'base64').toString('utf8')
			: decodeQuotedPrintable(text.replace(/_/g, ' '))
	);
}

function decodeQuotedPrintable(text: string): string {
	const bytes = text
		.replace(/=\r?\n/g, '')
		.replace(/=([0-9A-F]{2})/gi, (_, hex: string) => `%${hex}`);
	try {
		return decodeURIComponent(bytes);
	} catch {
		return bytes;
	}
}

/** Headers and text of a single-part message. */
export function parseMessage(raw: string): { headers: Map<string, string>; text: string } {
	const split = raw.search(/\r?\n\r?\n/);
	const head = split < 0 ? raw : raw.slice(0, split);
	const body = split < 0 ? '' : raw.slice(split).replace(/^\r?\n\r?\n/, '');
	const headers = new Map<string, string>();
	for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
		const colon = line.indexOf(':');
		if (colon > 0)
			headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
	}
	const encoding = headers.get('content-transfer-encoding')?.toLowerCase();
	const text =
		encoding === 'base64'
			? Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8')
			: encoding === 'quoted-printable'
				? decodeQuotedPrintable(body)
				: body;
	return { headers, text: text.trim() };
}

export class FakeSmtp {
	readonly messages: KeptMessage[] = [];
	private server: SMTPServer;
	private nextId = 1;
	port = 0;

	constructor() {
		this.server = new SMTPServer({
			authOptional: true,
			disabledCommands: ['STARTTLS'],
			logger: false,
			onData: (stream, session, callback) => {
				const chunks: Buffer[] = [];
				stream.on('data', (c: Buffer) => chunks.push(c));
				stream.on('end', () => {
					const { headers, text } = parseMessage(Buffer.concat(chunks).toString('utf8'));
					this.messages.unshift({
						id: this.nextId++,
						receivedAt: new Date().toISOString(),
						from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
						to: session.envelope.rcptTo.map((r) => r.address),
						subject: decodeWords(headers.get('subject') ?? ''),
						text
					});
					this.messages.length = Math.min(this.messages.length, KEEP);
					callback();
				});
			}
		});
	}

	listen(port: number): Promise<number> {
		return new Promise((resolve, reject) => {
			this.server.once('error', reject);
			this.server.listen(port, '127.0.0.1', () => {
				const address = this.server.server.address();
				this.port = typeof address === 'object' && address ? address.port : port;
				resolve(this.port);
			});
		});
	}

	close(): Promise<void> {
		return new Promise((resolve) => this.server.close(() => resolve()));
	}
}
