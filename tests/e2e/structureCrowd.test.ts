import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { signInCookie } from '../support/session';
import { startServer, type RunningServer } from '../support/server';

// A crowd on one large stored structure file: a 1.8 MB gzip of 26 MB of PDB text, posted to
// "plan" twelve times at once (each post a 1 kB form naming the kept file by its attachment id).
// Each read holds the file's text and the copy sent to the worker; before reads were taken one
// at a time (flow.ts, oneReadAtATime), twelve of them ran the 256 MB server heap out ("FATAL
// ERROR: Reached heap limit") and the process exited. Now the groups read by the upload are
// cached per attachment (readingCache.ts), so the plans read nothing again; a read after a cache
// miss is still one at a time (others 503 at once). Either way the server must keep answering.
const dir = mkdtempSync(join(tmpdir(), 'hopline-structure-crowd-'));
let server: RunningServer | null = null;
afterAll(async () => {
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

function pdbLine(
	serial: number,
	record: string,
	name: string,
	resName: string,
	chain: string,
	seq: number,
	x: number,
	y: number,
	z: number,
	element: string
): string {
	return (
		record.padEnd(6) +
		String(serial % 100000).padStart(5) +
		' ' +
		name.padEnd(4) +
		' ' +
		resName.padStart(3) +
		' ' +
		chain +
		String(seq).padStart(4) +
		'    ' +
		x.toFixed(3).padStart(8) +
		y.toFixed(3).padStart(8) +
		z.toFixed(3).padStart(8) +
		'  1.00 20.00' +
		' '.repeat(10) +
		element.padStart(2)
	);
}

/** Two small cofactor groups and 350 000 protein atoms: about 26 MB of text, 1.8 MB gzipped. */
function largeStructure(): Uint8Array<ArrayBuffer> {
	const lines = [
		pdbLine(1, 'HETATM', 'FE1', 'SF4', 'S', 301, 0, 0, 0, 'FE'),
		pdbLine(2, 'HETATM', 'FE', 'HEM', 'M', 401, 10, 0, 0, 'FE')
	];
	for (let i = 0; i < 350_000; i++)
		lines.push(
			pdbLine(
				i + 3,
				'ATOM',
				'CA',
				'ALA',
				'A',
				i % 9999,
				i % 100,
				Math.floor(i / 100) % 100,
				Math.floor(i / 10000),
				'C'
			)
		);
	return new Uint8Array(gzipSync(Buffer.from(lines.join('\n') + '\n')));
}

describe('many plan requests on one large stored structure', () => {
	it('leave the server running', async () => {
		server = await startServer(join(dir, 'crowd.sqlite'));
		const base = server.baseUrl;
		const cookie = await signInCookie(
			base,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		const proteins = (await (await fetch(`${base}/api/v1/proteins?q=HylSL`)).json()) as {
			items: { accession: string }[];
		};
		const protein = proteins.items[0]!.accession;
		const centres = (await (await fetch(`${base}/api/v1/centres?protein=${protein}`)).json()) as {
			items: { accession: string }[];
		};
		const form = new FormData();
		form.set('file', new Blob([largeStructure()]), 'large.pdb.gz');
		const read = await fetch(`${base}/submissions/upload/structure?protein=${protein}&/read`, {
			method: 'POST',
			headers: { cookie, origin: base, 'x-sveltekit-action': 'true' },
			body: form
		});
		const body = await read.text();
		expect(read.status).toBe(200);
		expect(body).toMatch(/[0-9a-f]{64}/);
		const kept = openDatabase(join(dir, 'crowd.sqlite'));
		const { id: attachment } = await kept
			.selectFrom('attachment')
			.select('id')
			.where('role', '=', 'structure')
			.orderBy('id', 'desc')
			.executeTakeFirstOrThrow();
		await kept.destroy();
		const plan = () =>
			fetch(`${base}/submissions/upload/structure?protein=${protein}&/plan`, {
				method: 'POST',
				headers: {
					cookie,
					origin: base,
					'x-sveltekit-action': 'true',
					'content-type': 'application/x-www-form-urlencoded'
				},
				body: new URLSearchParams({
					attachment: String(attachment),
					structureId: 'DS-RT-1',
					method: 'crystal_structure',
					cutoffA: '25',
					'match.0': centres.items[0]!.accession,
					'match.1': centres.items[1]!.accession
				})
			}).then(
				(r) => r.status,
				() => 'connection lost'
			);
		const statuses = await Promise.all(Array.from({ length: 12 }, plan));
		// Busy (503) would be a fair answer to some of them; a lost connection is not.
		expect(statuses.filter((s) => s === 'connection lost')).toEqual([]);
		expect(statuses.filter((s) => s === 200).length).toBeGreaterThan(0);
		expect(server.process.exitCode).toBeNull();
		expect((await fetch(`${base}/api/v1/facets`)).status).toBe(200);
	}, 180_000);
});
