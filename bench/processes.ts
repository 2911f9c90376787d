// What the benchmarks need of the processes they start: their memory, and the raw yardstick
// server (bench/raw-server.js) on a free port.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { freePort } from '../tests/support/server';

/** Resident memory of a process, MB (0 once it has exited). */
export function rssMb(pid: number): number {
	try {
		const status = readFileSync(`/proc/${pid}/status`, 'utf8');
		return Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024;
	} catch {
		return 0;
	}
}

export interface RawServer {
	base: string;
	stop: () => void;
}

/** bench/raw-server.js on `databasePath`, once it answers. */
export async function startRawServer(databasePath: string): Promise<RawServer> {
	const port = await freePort();
	const raw = spawn(process.execPath, ['bench/raw-server.js'], {
		env: { ...process.env, DATABASE_PATH: databasePath, PORT: String(port) },
		stdio: 'ignore'
	});
	const base = `http://127.0.0.1:${port}`;
	for (let i = 0; ; i++) {
		if (raw.exitCode !== null) throw new Error('the raw server exited');
		try {
			if ((await fetch(`${base}/?limit=1`)).ok) break;
		} catch {
			// not listening yet
		}
		if (i > 200) throw new Error('the raw server did not start within 20 s');
		await new Promise((r) => setTimeout(r, 100));
	}
	return { base, stop: () => raw.kill() };
}
