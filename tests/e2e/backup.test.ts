import { execFile } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { signInCookie } from '../support/session';
import { startServer, type RunningServer } from '../support/server';

// The backup command lines against a running production build: a backup while it serves, shown
// to admins; a restore refused while it runs, and done once it is stopped.
const run = promisify(execFile);
const dir = mkdtempSync(join(tmpdir(), 'hopline-backup-e2e-'));
const dbPath = join(dir, 'app.sqlite');
let server: RunningServer | null = null;
afterAll(async () => {
	await server?.stop();
	rmSync(dir, { recursive: true, force: true });
});

const cli = (script: string, arg: string) =>
	run(process.execPath, ['--import', 'tsx', `scripts/${script}.ts`, arg], {
		env: { ...process.env, DATABASE_PATH: dbPath }
	});

async function adminPage(path: string): Promise<string> {
	if (!server) throw new Error('no server');
	const cookie = await signInCookie(server.baseUrl, 'admin@demo.hopline.test', 'demo-admin-pass');
	const res = await fetch(`${server.baseUrl}${path}`, { headers: { cookie } });
	expect(res.status).toBe(200);
	return res.text();
}

describe('backups of a running app', () => {
	it('backs up while it serves, and admins see the backup', async () => {
		server = await startServer(dbPath);
		expect(await adminPage('/admin/users')).toContain('No backup recorded');
		const backupFile = join(dir, 'backups', 'first.sqlite');
		mkdirSync(join(dir, 'backups'));
		const { stdout } = await cli('db-backup', backupFile);
		expect(stdout).toMatch(/integrity ok/);
		expect(await adminPage('/admin/users')).toMatch(/Last backup \d{4}-\d{2}-\d{2}/);
		expect(await adminPage('/admin/backups')).toContain(backupFile);
	}, 120_000);

	it('refuses to restore while the app runs, and restores once it is stopped', async () => {
		const backupFile = join(dir, 'backups', 'first.sqlite');
		await expect(cli('db-restore', backupFile)).rejects.toMatchObject({
			stderr: expect.stringMatching(/Restore refused: .*in use/)
		});
		await server?.stop();
		server = null;
		const { stdout } = await cli('db-restore', backupFile);
		expect(stdout).toMatch(/The database it replaced is kept at .*before-restore-/);
		server = await startServer(dbPath);
		expect((await fetch(`${server.baseUrl}/api/v1/facets`)).ok).toBe(true);
		expect(await adminPage('/admin/backups')).toContain('restored from');
	}, 120_000);
});
