import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { closeHttpServer } from '../loopback';
import { cslFromMetadata, type DoiMetadata } from './cslJson';

/**
 * A loopback stand-in for a DOI metadata service, for the demo and the tests: answers
 * GET /{doi} with CSL-JSON for the DOIs it holds (test prefix 10.5555) and 404 for others.
 * `slowDois` answer only after `slowMs`, to exercise time-outs.
 */
export class FakeDoiService {
	private server: Server | null = null;
	port = 0;

	constructor(
		private readonly records: readonly DoiMetadata[],
		private readonly options: { slowDois?: readonly string[]; slowMs?: number } = {}
	) {}

	get baseUrl(): string {
		return `http://127.0.0.1:${this.port}`;
	}

	async listen(port = 0): Promise<void> {
		const byDoi = new Map(this.records.map((r) => [r.doi.toLowerCase(), r]));
		this.server = createServer((req, res) => {
			const doi = decodeURIComponent((req.url ?? '/').slice(1)).toLowerCase();
			const send = () => {
				const record = byDoi.get(doi);
				if (req.method !== 'GET' || !record) {
					res.writeHead(req.method === 'GET' ? 404 : 405, { 'content-type': 'text/plain' });
					res.end(req.method === 'GET' ? 'DOI not found' : 'GET only');
					return;
				}
				res.writeHead(200, { 'content-type': 'application/vnd.citationstyles.csl+json' });
				res.end(JSON.stringify(cslFromMetadata(record)));
			};
			if (this.options.slowDois?.includes(doi)) setTimeout(send, this.options.slowMs ?? 10_000);
			else send();
		});
		await new Promise<void>((resolve) => this.server?.listen(port, '127.0.0.1', resolve));
		this.port = (this.server.address() as AddressInfo).port;
	}

	async close(): Promise<void> {
		const server = this.server;
		if (!server) return;
		this.server = null;
		await closeHttpServer(server);
	}
}
