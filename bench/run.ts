// `npm run bench`: performance figures for the catalogue, printed, never asserted.
// 1. search (text + filters + first page) p50/p95 server-side on 100 000 potentials, per query
//    (plain words, the trade's spellings of clusters, couples and methods) and over all;
// 2. API list throughput (100 rows a page) beside a raw node:http + better-sqlite3 server;
// 3. server RSS after the search index is built;
// 3b. pages and API under load with autocannon, demo data and 100 000 potentials (bench/http.ts,
//    also `npm run bench:http`);
// 4. CSV upload: 100 000 rows checked and committed, beside raw prepared inserts (bench/upload.ts);
// 5. approving a 50 000-row batch while reading and writing (bench/approval.ts);
// 6. latency of GET /api/v1 while three heavy calculator requests run (bench/calc.ts);
// 7. the pages of a centre with 5 000 potentials: time and server memory (bench/largeCentre.ts);
// 8. first-load JavaScript per page, gzipped, against its goal (bench/pageJs.ts; after a build,
//    also `npm run bench:js`);
// 9. an attachment image: preview + thumbnail of a 4000 × 3000 JPEG in the image worker, and the
//    longest event-loop stall meanwhile (bench/attachments.ts);
// and first, the science engine's timings (bench/science.ts).
// `npm run bench -- approval upload` runs only the steps named (science, search, api, http, upload,
// approval, calc, largeCentre, pageJs, attachments). Figures go to bench/RESULTS.md (bench/results.ts).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { listPotentials } from '../src/lib/server/catalogue/potentials';
import { centreSearch } from '../src/lib/server/search/centreSearch';
import { potentialIndex } from '../src/lib/server/search/potentialIndex';
import { openDatabase } from '../src/lib/server/db/connect';
import type { PotentialFilter } from '../src/lib/schemas/catalogueQuery';
import { ensureDataset } from './dataset';
import { serverArgs } from '../scripts/serverArgs.js';
import { benchScience } from './science';
import { benchUpload } from './upload';
import { benchCalcLatency } from './calc';
import { benchLargeCentre } from './largeCentre';
import { recordOutput, writeResults } from './results';
import { benchApproval } from './approval';
import { benchHttp } from './http';
import { benchPageJs } from './pageJs';
import { benchAttachments } from './attachments';
import { rssMb, startRawServer, type RawServer } from './processes';
import { freePort } from '../tests/support/server';

const DATASET = 'bench/.data/catalogue-100k.sqlite';
const SIZE = { proteins: 2500, centresPerProtein: 10, potentialsPerCentre: 4 };
const LOAD_SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 8);
const CONCURRENCY = 8;

function percentile(sorted: number[], p: number): number {
	return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] as number;
}
const ms = (v: number) => `${v.toFixed(2)} ms`;

async function benchSearch() {
	const db = openDatabase(DATASET);
	const t0 = performance.now();
	await centreSearch.ensureCurrent(db);
	const indexMs = performance.now() - t0;
	const t1 = performance.now();
	await potentialIndex.ensureCurrent(db);
	const columnsMs = performance.now() - t1;
	const cases: PotentialFilter[] = [
		{ q: 'ferredoxin' },
		{ q: 'hydrogenase C3' },
		{ q: 'thermocytochrome' },
		{ q: 'hydrgenase' },
		{ q: 'cyto', kind: ['heme_c'] },
		{ q: '4Fe-4S', emMin: -300, emMax: -100 },
		{ q: 'rieske', phMin: 6, phMax: 8 },
		{ q: 'Benchmarkia thermophilus' },
		{ kind: ['fe4s4'], emMin: -300, emMax: -100 },
		{ organism: ['Benchmarkia ferrogenes'], tMin: 300 },
		{ method: ['protein_film_voltammetry'], phMin: 7, phMax: 7.5 },
		{},
		// The trade's spellings (src/lib/catalogue/searchTerms.ts): cluster cores, couples,
		// methods and their abbreviations, two-word cofactor names, mixed terms.
		{ q: '4Fe4S' },
		{ q: '[4Fe-4S]2+/1+' },
		{ q: '2+/1+' },
		{ q: 'EPR' },
		{ q: 'heme c' },
		{ q: 'EPR 4Fe4S' },
		{ q: 'PFV ferredoxin' },
		{ q: 'Fe4S4 2+/1+', kind: ['fe4s4'], phMin: 6, phMax: 8 }
	];
	for (const c of cases) await listPotentials(db, c, { limit: 25, offset: 0 }, null); // warm caches
	const times: number[] = [];
	const perCase = new Map<string, number[]>();
	for (let round = 0; round < 20; round++) {
		for (const c of cases) {
			const start = performance.now();
			const page = await listPotentials(
				db,
				c,
				{ limit: 25, offset: 0, sort: c.q ? 'relevance' : 'em' },
				null
			);
			const elapsed = performance.now() - start;
			times.push(elapsed);
			const key = `${JSON.stringify(c)} → ${page.total} rows`;
			perCase.set(key, [...(perCase.get(key) ?? []), elapsed]);
		}
	}
	times.sort((a, b) => a - b);
	await db.destroy();
	console.log(
		`\nSearch (listPotentials: text + filters + count + first 25 rows), ${times.length} queries`
	);
	console.log(
		`  text index build ${ms(indexMs)} for ${centreSearch.documentCount} documents (proteins + centres); ` +
			`potential columns build ${ms(columnsMs)} (repeated after every change to the catalogue)`
	);
	for (const [key, t] of perCase) {
		t.sort((a, b) => a - b);
		console.log(
			`  p50 ${ms(percentile(t, 50)).padStart(9)}  p95 ${ms(percentile(t, 95)).padStart(9)}  ${key}`
		);
	}
	console.log(
		`  p50 ${ms(percentile(times, 50))}   p95 ${ms(percentile(times, 95))}   max ${ms(times.at(-1) ?? 0)}   (target p95 ≤ 20 ms)`
	);
}

async function waitFor(url: string, child: ChildProcess) {
	for (let i = 0; i < 300; i++) {
		if (child.exitCode !== null) throw new Error(`${url}: server exited`);
		try {
			if ((await fetch(url)).ok) return;
		} catch {
			// not up yet
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`${url} did not answer`);
}

async function load(
	urlFor: (i: number) => string
): Promise<{ rps: number; p50: number; p95: number; count: number }> {
	const deadline = performance.now() + LOAD_SECONDS * 1000;
	const latencies: number[] = [];
	let i = 0;
	await Promise.all(
		Array.from({ length: CONCURRENCY }, async () => {
			while (performance.now() < deadline) {
				const start = performance.now();
				const res = await fetch(urlFor(i++));
				if (!res.ok) throw new Error(`HTTP ${res.status}`);
				await res.arrayBuffer();
				latencies.push(performance.now() - start);
			}
		})
	);
	latencies.sort((a, b) => a - b);
	return {
		rps: latencies.length / LOAD_SECONDS,
		p50: percentile(latencies, 50),
		p95: percentile(latencies, 95),
		count: latencies.length
	};
}

async function benchApi() {
	if (!existsSync('build/index.js')) throw new Error('Run `npm run build` before `npm run bench`.');
	// BENCH_APP_PORT when several people bench on one machine; otherwise any free port.
	const appPort = Number(process.env.BENCH_APP_PORT ?? 0) || (await freePort());
	const env = { ...process.env, DATABASE_PATH: DATASET, HOPLINE_DEMO: 'false' };
	const app = spawn(process.execPath, serverArgs(), {
		env: {
			...env,
			PORT: String(appPort),
			HOST: '127.0.0.1',
			ORIGIN: `http://127.0.0.1:${appPort}`
		},
		stdio: 'ignore'
	});
	let raw: RawServer | null = null;
	try {
		await waitFor(`http://127.0.0.1:${appPort}/api/v1`, app);
		raw = await startRawServer(DATASET);
		const rawBase = raw.base;
		const before = rssMb(app.pid as number);
		await fetch(`http://127.0.0.1:${appPort}/api/v1/potentials?q=ferredoxin&limit=100`);
		const afterIndex = rssMb(app.pid as number);

		const pages = 200; // the first 200 pages of 100 rows, visited in the same order by both
		// The app's pages by their keyset cursors, found by walking the list once (links.next).
		const walkStart = performance.now();
		const appPages: string[] = [];
		let next: string | null = `http://127.0.0.1:${appPort}/api/v1/potentials?limit=100`;
		while (next && appPages.length < pages) {
			appPages.push(next);
			const page = (await (await fetch(next)).json()) as { links: { next: string | null } };
			// Absolute since keyset cursors; a path before (resolved here so older builds compare).
			next = page.links.next ? new URL(page.links.next, next).href : null;
		}
		const walkMs = performance.now() - walkStart;
		const rawResult = await load((i) => `${rawBase}/?limit=100&offset=${(i % pages) * 100}`);
		const appResult = await load((i) => appPages[i % appPages.length]!);
		const afterLoad = rssMb(app.pid as number);
		console.log(
			`\nAPI list throughput, 100 rows a page, ${CONCURRENCY} concurrent clients, ${LOAD_SECONDS} s each`
		);
		console.log(
			`  raw node:http + better-sqlite3  ${rawResult.rps.toFixed(1)} req/s  (p50 ${ms(rawResult.p50)}, p95 ${ms(rawResult.p95)}, ${rawResult.count} requests)`
		);
		console.log(
			`  Hopline /api/v1/potentials      ${appResult.rps.toFixed(1)} req/s  (p50 ${ms(appResult.p50)}, p95 ${ms(appResult.p95)}, ${appResult.count} requests)`
		);
		console.log(`  ratio ${(appResult.rps / rawResult.rps).toFixed(2)}× raw   (target ≥ 0.5×)`);
		console.log(
			`  first walk of the ${appPages.length} pages by links.next (nothing cached yet, one client): ${(walkMs / 1000).toFixed(2)} s, ${ms(walkMs / appPages.length)} a page`
		);
		console.log(
			`\nServer memory (RSS): at start ${before.toFixed(0)} MB, after indexing ${afterIndex.toFixed(0)} MB, after load ${afterLoad.toFixed(0)} MB   (target ≤ 400 MB)`
		);
	} finally {
		app.kill();
		raw?.stop();
	}
}

const STEPS = [
	'science',
	'search',
	'api',
	'http',
	'upload',
	'approval',
	'calc',
	'largeCentre',
	'pageJs',
	'attachments'
] as const;
const named = process.argv.slice(2);
const unknown = named.filter((n) => !(STEPS as readonly string[]).includes(n));
if (unknown.length > 0) throw new Error(`unknown step(s) ${unknown.join(', ')}; known: ${STEPS}`);
const runs = (step: (typeof STEPS)[number]) => named.length === 0 || named.includes(step);

if (runs('science')) {
	recordOutput('science');
	benchScience();
}
// Every step but science, pageJs and attachments reads the 100 000-potential catalogue.
const OWN_DATA = ['science', 'pageJs', 'attachments'];
if (STEPS.some((step) => !OWN_DATA.includes(step) && runs(step))) {
	const dataset = await ensureDataset(DATASET, SIZE);
	console.log(
		dataset.created
			? `Generated ${DATASET}: ${SIZE.proteins} proteins, ${SIZE.proteins * SIZE.centresPerProtein} centres, ${SIZE.proteins * SIZE.centresPerProtein * SIZE.potentialsPerCentre} potentials in ${dataset.seconds.toFixed(1)} s`
			: `Using ${DATASET} (delete it to regenerate)`
	);
}
if (runs('search')) {
	recordOutput('search');
	await benchSearch();
}
if (runs('api')) {
	recordOutput('api');
	await benchApi();
}
if (runs('http')) {
	recordOutput('http');
	await benchHttp(DATASET);
}
if (runs('upload')) {
	recordOutput('upload');
	await benchUpload(DATASET);
}
if (runs('approval')) {
	recordOutput('approval');
	await benchApproval(DATASET);
}
if (runs('calc')) {
	recordOutput('calc');
	await benchCalcLatency();
}
if (runs('largeCentre')) {
	recordOutput('largeCentre');
	await benchLargeCentre();
}
if (runs('pageJs')) {
	recordOutput('pageJs');
	await benchPageJs();
}
if (runs('attachments')) {
	recordOutput('attachments');
	await benchAttachments();
}
writeResults(STEPS);
