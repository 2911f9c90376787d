import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
	}
}

async function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolve(port));
		});
	});
}

/**
 * Starts the production build (adapter-node) on a fresh temporary SQLite file with the demo
 * scenario, for the HTTP and browser tests. `npm test` builds before it runs.
 */
export default async function setup(project: TestProject) {
	if (!existsSync('build/index.js'))
		throw new Error('No production build: run `npm run build` first.');
	mkdirSync('test-results', { recursive: true }); // screenshots of the browser tests land here
	const dir = mkdtempSync(join(tmpdir(), 'hopline-e2e-'));
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const server: ChildProcess = spawn(process.execPath, ['build'], {
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: baseUrl,
			HOPLINE_DEMO: 'true',
			// The app enforces its own body limits (src/lib/server/requestLimits.ts).
			BODY_SIZE_LIMIT: 'Infinity',
			DATABASE_PATH: join(dir, 'e2e.sqlite')
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	server.stdout?.on('data', (d) => (output += d));
	server.stderr?.on('data', (d) => (output += d));

	const deadline = Date.now() + 60_000;
	for (;;) {
		if (server.exitCode !== null) throw new Error(`The server exited early:\n${output}`);
		try {
			if ((await fetch(`${baseUrl}/api/v1/facets`)).ok) break;
		} catch {
			// not listening yet
		}
		if (Date.now() > deadline) throw new Error(`The server did not answer within 60 s:\n${output}`);
		await new Promise((r) => setTimeout(r, 200));
	}
	project.provide('baseUrl', baseUrl);

	return async () => {
		// A graceful stop first; if anything keeps the server alive, it must not hang the run.
		const exited = new Promise((r) => server.once('exit', r));
		server.kill('SIGTERM');
		const timer = setTimeout(() => server.kill('SIGKILL'), 5000);
		await exited;
		clearTimeout(timer);
		rmSync(dir, { recursive: true, force: true });
	};
}
