// One centre with 5 000 potentials, nearly all in conflict with each other: the time of its
// entry pages and API paths (median and worst of repeated requests, one at a time) and the
// server's resident memory afterwards. Figures only; the bounds are asserted (without timing)
// in tests/e2e/largeCentre.test.ts.
import { mkdirSync, rmSync } from 'node:fs';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { buildLargeCentre } from '../tests/support/largeCentre';
import { startServer } from '../tests/support/server';
import { rssMb } from './processes';

const COUNT = 5000;
const ROUNDS = 10;
const PATH = 'bench/.data/large-centre.sqlite';

export async function benchLargeCentre(): Promise<void> {
	mkdirSync('bench/.data', { recursive: true });
	for (const suffix of ['', '-wal', '-shm']) rmSync(`${PATH}${suffix}`, { force: true });
	const db = openDatabase(PATH);
	await migrateToLatest(db);
	const fx = await buildLargeCentre(db, COUNT);
	await db.destroy();
	const server = await startServer(PATH, { HOPLINE_DEMO: 'false' });
	try {
		const startRss = rssMb(server.process.pid as number);
		const paths = [
			`/e/${fx.centre}`,
			`/e/${fx.centre}?potentials=60`,
			`/e/${fx.protein}`,
			`/e/${fx.onePotential}`,
			`/api/v1/potentials?centre=${fx.centre}&limit=100`
		];
		console.log(
			`\nA centre with ${COUNT} potentials (nearly all pairs in conflict), ${ROUNDS} requests a path`
		);
		for (const path of paths) {
			await fetch(`${server.baseUrl}${path}`).then((r) => r.arrayBuffer()); // warm
			const times: number[] = [];
			let bytes = 0;
			for (let i = 0; i < ROUNDS; i++) {
				const t = performance.now();
				const res = await fetch(`${server.baseUrl}${path}`);
				bytes = (await res.arrayBuffer()).byteLength;
				times.push(performance.now() - t);
			}
			times.sort((a, b) => a - b);
			console.log(
				`  ${path.padEnd(52)} median ${times[ROUNDS >> 1]!.toFixed(1)} ms, max ${times.at(-1)!.toFixed(1)} ms, ${(bytes / 1024).toFixed(0)} KB`
			);
		}
		console.log(
			`  server RSS: ${startRss.toFixed(0)} MB at start, ${rssMb(server.process.pid as number).toFixed(0)} MB after   (bound in the test: 400 MB)`
		);
	} finally {
		await server.stop();
	}
}
