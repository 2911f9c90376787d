// Latency of a trivial `GET /api/v1` while three heavy calculator requests run, against a
// production build (adapter-node). Figures are printed, never asserted.
//
//   npm run build && npm run bench:calc                  this build
//   BENCH_BUILD=/path/to/other/build npm run bench:calc  another build (e.g. an older commit's)
//
// The heavy requests are valid before and after calculations moved to worker threads: a
// double-well tunnelling calculation on a 600-point grid with 20 levels (three DVR solutions).
import { serverArgs } from '../scripts/serverArgs.js';
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { freePort } from '../tests/support/server';

const HEAVY = JSON.stringify({
	points: 600,
	levels: 20,
	potential: { kind: 'double-well', barrierKcalMol: 8, halfSeparationA: 0.35 }
});

const ms = (v: number) => `${v.toFixed(1)} ms`;
const percentile = (sorted: number[], p: number) =>
	sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;

async function timedGet(url: string): Promise<number> {
	const start = performance.now();
	const res = await fetch(url);
	await res.arrayBuffer();
	if (!res.ok) throw new Error(`GET ${url}: HTTP ${res.status}`);
	return performance.now() - start;
}

export async function benchCalcLatency(build = process.env.BENCH_BUILD ?? 'build'): Promise<void> {
	const entry = resolve(build, 'index.js');
	if (!existsSync(entry)) throw new Error(`No build at ${build}: run \`npm run build\` first.`);
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-calc-'));
	const port = await freePort();
	const base = `http://127.0.0.1:${port}`;
	const app = spawn(process.execPath, serverArgs(entry), {
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: base,
			BODY_SIZE_LIMIT: 'Infinity',
			HOPLINE_DEMO: 'false',
			DATABASE_PATH: join(dir, 'bench.sqlite')
		},
		stdio: 'ignore'
	});
	try {
		for (let i = 0; ; i++) {
			if (app.exitCode !== null) throw new Error('the server exited');
			try {
				if ((await fetch(`${base}/api/v1`)).ok) break;
			} catch {
				// not listening yet
			}
			if (i > 300) throw new Error('the server did not start within 30 s');
			await new Promise((r) => setTimeout(r, 100));
		}
		for (let i = 0; i < 10; i++) await timedGet(`${base}/api/v1`); // warm up
		const idle: number[] = [];
		for (let i = 0; i < 30; i++) idle.push(await timedGet(`${base}/api/v1`));
		idle.sort((a, b) => a - b);

		const start = performance.now();
		let running = 3;
		const heavyMs: number[] = [];
		const heavy = Array.from({ length: 3 }, async () => {
			const res = await fetch(`${base}/api/v1/calc/tunnelling`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', origin: base },
				body: HEAVY
			});
			await res.arrayBuffer();
			if (!res.ok) throw new Error(`heavy request: HTTP ${res.status}`);
			heavyMs.push(performance.now() - start);
			running--;
		});
		await new Promise((r) => setTimeout(r, 100));
		const loaded: number[] = [];
		let failed = 0;
		// One GET after another while any heavy request is unanswered (bounded: 120 s). A blocked
		// server can drop a kept-alive connection (its keep-alive timer fires late): counted apart.
		while (running > 0 && performance.now() - start < 120_000) {
			const sent = performance.now();
			try {
				loaded.push(await timedGet(`${base}/api/v1`));
			} catch {
				failed++;
				loaded.push(performance.now() - sent);
			}
			await new Promise((r) => setTimeout(r, 20));
		}
		await Promise.all(heavy);
		loaded.sort((a, b) => a - b);
		console.log(`\nGET /api/v1 while 3 heavy calculator requests run (${build})`);
		console.log(
			`  idle: p50 ${ms(percentile(idle, 50))}, max ${ms(idle.at(-1) ?? 0)} (${idle.length} requests)`
		);
		console.log(
			`  during: p50 ${ms(percentile(loaded, 50))}, max ${ms(loaded.at(-1) ?? 0)} (${loaded.length} requests, ${failed} failed)`
		);
		console.log(
			`  heavy requests answered after ${heavyMs.map((t) => (t / 1000).toFixed(1)).join(', ')} s`
		);
	} finally {
		app.kill();
		rmSync(dir, { recursive: true, force: true });
	}
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await benchCalcLatency();
