import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '$lib/server/db/connect';
import { migrateToLatest } from '$lib/server/db/migrate';
import { ensureDemoAccounts } from '../../seed/accounts';
import { loadDemoScenario } from '../../seed/load';
import { createTokenOnAccount } from '../support/apiTokens';
import { pngOf } from '../support/hostileFiles';
import { startServer, type RunningServer } from '../support/server';
import { signInCookie } from '../support/session';

/*
 * The attachment paths under abuse, from a security review:
 *  1. unknown multipart fields once each added an error message: 20 000 empty fields (1.1 MB)
 *     answered 7.6 MB, and 200 000 (11.5 MB, under the attach limit) ran the server out of heap.
 *     A form of more than ATTACHMENT_FORM_MAX_PARTS parts is now refused whole, in a line.
 *  2. a file attached to a returned CSV batch's version was never shown to the curator, yet
 *     published with the approval. Batches now carry no files (409).
 *  3. a garbled body to the page's remove action answered 500; now 400.
 */

let server: RunningServer;
let base = '';
let dir = '';
let token = '';
let cookie = '';
let curator = '';

function manyFields(n: number): string {
	const parts = Array.from(
		{ length: n },
		(_, i) => `--XX\r\nContent-Disposition: form-data; name="x${i}"\r\n\r\n\r\n`
	);
	return parts.join('') + '--XX--\r\n';
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'hopline-attach-abuse-'));
	const path = join(dir, 'a.sqlite');
	const db = openDatabase(path);
	await migrateToLatest(db);
	await loadDemoScenario(db);
	await ensureDemoAccounts(db);
	await db.destroy();
	server = await startServer(path);
	base = server.baseUrl;
	cookie = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	curator = await signInCookie(base, 'curator@demo.hopline.test', 'demo-curator-pass');
	token = await createTokenOnAccount(base, cookie, { name: 'files', scope: 'read+submit' });
}, 180_000);

afterAll(async () => {
	await server?.stop();
	if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('attachment paths under abuse', () => {
	it('answers a body of many unknown fields with a bounded refusal', async () => {
		const draft = await fetch(`${base}/api/v1/submissions`, {
			method: 'POST',
			headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
			body: JSON.stringify({ kind: 'protein', data: { name: 'Fields', organism: 'Testus' } })
		});
		const { id } = (await draft.json()) as { id: number };
		const res = await fetch(`${base}/api/v1/submissions/${id}/attachments`, {
			method: 'POST',
			headers: {
				authorization: `Bearer ${token}`,
				'content-type': 'multipart/form-data; boundary=XX'
			},
			body: manyFields(20_000)
		});
		const body = await res.text();
		expect(res.status).toBe(400);
		expect(body.length).toBeLessThan(2 * 1024);
		expect(body).toContain('more than 32 parts');
		// The server is still there.
		expect((await fetch(`${base}/api/v1/facets`)).status).toBe(200);
	}, 60_000);

	it("refuses files on a CSV batch's versions, which a curator would never see (409)", async () => {
		const csv =
			'proteinAccession,label,cofactorKind,ligation,chainId,residues,coordinatesAngstrom,note,proteinName,organism,uniprot,structureIds\n' +
			'HL000007,RX1,fe4s4,Cys4,B,45 48 51 83,10.1 -4.2 33.0,batch,,,,\n' +
			'HL000007,RX2,fe4s4,Cys4,B,55 58 61 93,12.1 -4.2 33.0,batch,,,,\n';
		const form = new FormData();
		form.append('kind', 'centre');
		form.append('file', new Blob([csv], { type: 'text/csv' }), 'batch.csv');
		const up = await fetch(`${base}/submissions/upload?/commit`, {
			method: 'POST',
			headers: { cookie, origin: base, 'x-sveltekit-action': 'true' },
			body: form
		});
		const location = JSON.parse(await up.text()).location as string;
		const id = Number(/\/submissions\/(\d+)/.exec(location)?.[1]);
		// The curator sends the whole file back; the contributor attaches a file to one row.
		const back = await fetch(`${base}/review/${id}?/batch`, {
			method: 'POST',
			headers: {
				cookie: curator,
				origin: base,
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams({ decision: 'return', comment: 'please check the rows' })
		});
		expect(back.status).toBe(200);
		// The API lists no versions for a batch: its rows' accessions are read from the database.
		const db = openDatabase(join(dir, 'a.sqlite'));
		const row = await db
			.selectFrom('entry_version as v')
			.innerJoin('entry as e', 'e.id', 'v.entry_id')
			.select('e.accession')
			.where('v.submission_id', '=', id)
			.executeTakeFirstOrThrow();
		await db.destroy();
		const accession = row.accession;
		const attach = new FormData();
		attach.append('entry', accession);
		attach.append('kind', 'other');
		attach.append('caption', 'A figure the curator should see');
		attach.append(
			'file',
			new Blob([new Uint8Array(await pngOf(300, 200))], { type: 'image/png' }),
			'p.png'
		);
		const res = await fetch(`${base}/api/v1/submissions/${id}/attachments`, {
			method: 'POST',
			headers: { authorization: `Bearer ${token}` },
			body: attach
		});
		// Refused: a batch is reviewed row by row, with nowhere to show a file to the curator.
		expect(res.status).toBe(409);
		expect(((await res.json()) as { error: { message: string } }).error.message).toContain(
			'CSV batch'
		);
	}, 60_000);

	it("answers a garbled body to the page's remove action with 400, not 500", async () => {
		const res = await fetch(`${base}/submissions/1?/detach`, {
			method: 'POST',
			headers: {
				cookie,
				origin: base,
				'x-sveltekit-action': 'true',
				'content-type': 'multipart/form-data; boundary=XX'
			},
			body: 'garbage'
		});
		const text = await res.text();
		expect(text).not.toContain('Something went wrong');
		expect(JSON.parse(text)).toMatchObject({ type: 'failure', status: 400 });
	}, 60_000);
});
