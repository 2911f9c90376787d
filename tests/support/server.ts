import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { serverArgs } from '../../scripts/serverArgs.js';

/** Starting the production build (adapter-node) as a child process, for HTTP and browser tests. */

export async function freePort(): Promise<number> {
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

export interface RunningServer {
	/** Where the test connects (always plain http on loopback). */
	baseUrl: string;
	/** The site's ORIGIN, as the app believes it is served (https behind a proxy, say). */
	origin: string;
	process: ChildProcess;
	output: () => string;
	/** SIGTERM, then SIGKILL after 5 s if anything keeps it alive. */
	stop: () => Promise<void>;
}

export async function startServer(
	databasePath: string,
	env: Record<string, string> = {},
	options: { scheme?: 'http' | 'https' } = {}
): Promise<RunningServer> {
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	// An https ORIGIN stands for a TLS-terminating proxy in front; the test still speaks http.
	const origin = `${options.scheme ?? 'http'}://127.0.0.1:${port}`;
	const server = spawn(process.execPath, serverArgs(), {
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin,
			HOPLINE_DEMO: 'true',
			// The app enforces its own body limits (src/lib/server/requestLimits.ts).
			BODY_SIZE_LIMIT: 'Infinity',
			DATABASE_PATH: databasePath,
			...env
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
	return {
		baseUrl,
		origin,
		process: server,
		output: () => output,
		stop: async () => {
			if (server.exitCode !== null || server.signalCode !== null) return;
			const exited = new Promise((r) => server.once('exit', r));
			server.kill('SIGTERM');
			const timer = setTimeout(() => server.kill('SIGKILL'), 5000);
			await exited;
			clearTimeout(timer);
		}
	};
}
