import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lookupDoi, normaliseDoi } from '$lib/server/sources/doiClient';
import { FakeDoiService } from '$lib/server/sources/fakeDoiService';
import { DEMO_DOI_RECORDS } from '$seed/demoDois';

// The DOI client against the loopback fake (and two misbehaving servers), over real HTTP.
const fake = new FakeDoiService(DEMO_DOI_RECORDS, {
	slowDois: ['10.5555/hopline.demo.2026.058'],
	slowMs: 2000
});
const broken = createServer((req, res) => {
	res.writeHead(req.url?.includes('garbage') ? 200 : 500, { 'content-type': 'application/json' });
	res.end(req.url?.includes('garbage') ? '{"no":"title"}' : 'oops');
});
let brokenUrl = '';

beforeAll(async () => {
	await fake.listen();
	await new Promise<void>((r) => broken.listen(0, '127.0.0.1', r));
	brokenUrl = `http://127.0.0.1:${(broken.address() as AddressInfo).port}`;
});
afterAll(async () => {
	await fake.close();
	broken.closeAllConnections();
	await new Promise((r) => broken.close(r));
});

describe('DOI look-up', () => {
	it('reads title, authors, journal and year from CSL-JSON', async () => {
		const r = await lookupDoi('https://doi.org/10.5555/hopline.demo.2026.031', {
			baseUrl: fake.baseUrl,
			timeoutMs: 1000
		});
		expect(r).toEqual({
			ok: true,
			metadata: {
				doi: '10.5555/hopline.demo.2026.031',
				title:
					'Proton-coupled tuning of a Rieske-type cluster in a fictional thermophile bc complex',
				authors: ['Moreau, Céline', 'Achterberg, Jonas', 'Okafor, Adaeze'],
				journal: 'Journal of Demonstration Bioenergetics',
				year: 2026
			}
		});
	});
	it('says so when the DOI has no record', async () => {
		const r = await lookupDoi('10.5555/not.registered', { baseUrl: fake.baseUrl, timeoutMs: 1000 });
		expect(r).toEqual({
			ok: false,
			reason: 'not_found',
			message: 'no record for DOI 10.5555/not.registered'
		});
	});
	it('gives up after the time-out with a message to fill in by hand', async () => {
		const r = await lookupDoi('10.5555/hopline.demo.2026.058', {
			baseUrl: fake.baseUrl,
			timeoutMs: 200
		});
		expect(r.ok || r.reason).toBe('timeout');
		expect(r.ok || r.message).toMatch(/did not answer within 0.2 s; fill in the fields by hand/);
	});
	it('refuses a malformed DOI without calling the service', async () => {
		const r = await lookupDoi('doi:11.1/x', { baseUrl: 'http://127.0.0.1:9', timeoutMs: 100 });
		expect(r.ok || r.reason).toBe('malformed');
	});
	it('reports a service that is down, or answers 500, or answers nonsense', async () => {
		const down = await lookupDoi('10.5555/x', { baseUrl: 'http://127.0.0.1:9', timeoutMs: 1000 });
		expect(down.ok || down.reason).toBe('unavailable');
		const error = await lookupDoi('10.5555/x', { baseUrl: brokenUrl, timeoutMs: 1000 });
		expect(error.ok || error.message).toMatch(/answered 500/);
		const garbage = await lookupDoi('10.5555/garbage', { baseUrl: brokenUrl, timeoutMs: 1000 });
		expect(garbage.ok || garbage.reason).toBe('bad_response');
	});
	it('accepts the ways people paste DOIs', () => {
		expect(normaliseDoi(' doi:10.5555/ABC ')).toBe('10.5555/ABC');
		expect(normaliseDoi('http://dx.doi.org/10.5555/abc')).toBe('10.5555/abc');
	});
});
