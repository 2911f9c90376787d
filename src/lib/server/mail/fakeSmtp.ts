import PostalMime from 'postal-mime';
import { SMTPServer } from 'smtp-server';

/*
 * A local SMTP server that keeps what it receives, for the demo and the tests: mail never leaves
 * the machine, and admins can read it at /admin/mail in demo mode. Keeps each message's subject
 * and plain text.
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

/**
 * Subject and text of a message, decoded by postal-mime (MIME parts, transfer encodings, charsets,
 * RFC 2047 encoded words across folded lines).
 */
export async function parseMessage(
	raw: string | Buffer
): Promise<{ subject: string; text: string }> {
	const email = await PostalMime.parse(raw);
	return { subject: email.subject ?? '', text: (email.text ?? '').trim() };
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
					parseMessage(Buffer.concat(chunks)).then(
						({ subject, text }) => {
							this.messages.unshift({
								id: this.nextId++,
								receivedAt: new Date().toISOString(),
								from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
								to: session.envelope.rcptTo.map((r) => r.address),
								subject,
								text
							});
							this.messages.length = Math.min(this.messages.length, KEEP);
							callback();
						},
						(e: unknown) => callback(e instanceof Error ? e : new Error(String(e)))
					);
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
