import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { signInCookie } from '../support/session';
import { startServer, type RunningServer } from '../support/server';

// A server killed with SIGKILL in the middle of committing a large batch leaves the batch either
// absent or complete, and the database intact.
const dir = mkdtempSync(join(tmpdir(), 'hopline-crash-'));
const dbPath = join(dir, 'crash.sqlite');
let server: RunningServer | null = null;
afterAll(async () => {
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

const ROWS = 40_000;

function largeFile(): string {
	const lines = [
		'centreAccession,couple,reportedValue,reportedUnit,referenceElectrode,ph,temperatureK,method'
	];
	for (let i = 0; i < ROWS; i++) {
		const ph = (4 + (Math.floor(i / 1000) % 100) * 0.05).toFixed(2);
		lines.push(
			`HL000011,[4Fe-4S]2+/1+,${(-200 - (i % 1000) * 0.1).toFixed(1)},mV,SHE,${ph},298.15,optical_titration`
		);
	}
	return lines.join('\n');
}

const walSize = () => {
	try {
		return statSync(`${dbPath}-wal`).size;
	} catch {
		return 0;
	}
};

describe('a crash during a commit', () => {
	it('leaves the batch absent or complete, and the database intact', async () => {
		server = await startServer(dbPath);
		const cookie = await signInCookie(
			server.baseUrl,
			'contributor@demo.hopline.test',
			'demo-contributor-pass'
		);
		const text = largeFile();
		const sha256 = createHash('sha256').update(text).digest('hex');
		const form = new FormData();
		form.set('kind', 'potential');
		form.set('file', new Blob([text], { type: 'text/csv' }), 'large.csv');
		const baseline = walSize();
		const request = fetch(`${server.baseUrl}/submissions/upload?/commit`, {
			method: 'POST',
			headers: { origin: server.baseUrl, cookie, 'x-sveltekit-action': 'true' },
			body: form
		}).catch(() => null);
		// Kill as soon as the commit has begun writing (the write-ahead log grows), or after 60 s.
		const deadline = Date.now() + 60_000;
		while (walSize() < baseline + 512 * 1024 && Date.now() < deadline) {
			await new Promise((r) => setTimeout(r, 5));
		}
		server.process.kill('SIGKILL');
		await request;
		server = null;

		const db = new Database(dbPath);
		try {
			expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
			const batch = db
				.prepare('select id, row_count from submission where content_sha256 = ?')
				.get(sha256) as { id: number; row_count: number } | undefined;
			if (batch) {
				const versions = db
					.prepare('select count(*) as n from entry_version where submission_id = ?')
					.get(batch.id) as { n: number };
				expect(versions.n).toBe(ROWS);
			}
			const orphans = db
				.prepare(
					"select count(*) as n from entry e where kind = 'potential' and not exists (select 1 from entry_version v where v.entry_id = e.id)"
				)
				.get() as { n: number };
			expect(orphans.n).toBe(0);
			console.log(
				batch
					? 'the commit had finished before the kill'
					: 'the kill interrupted the commit; nothing of it remains'
			);
		} finally {
			db.close();
		}
		// The app starts again on the same file.
		server = await startServer(dbPath);
		expect((await fetch(`${server.baseUrl}/api/v1/facets`)).ok).toBe(true);
	}, 120_000);
});
