// Read throughput over HTTP, as citers, crawlers and modellers load the site: autocannon against
// the production build, beside a raw node:http + better-sqlite3 server answering the same list
// query in the same run (bench/raw-server.js), on the demo data and on the 100 000-potential
// bench catalogue. Each row: 50 connections for LOAD_SECONDS; then 200 connections for
// MIX_SECONDS over a mix of permalinks, protein pages, searches and API lists. Figures are
// printed, never asserted; the machine's load generator shares the machine's cores.
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import SQLite from 'better-sqlite3';
import { startServer, type RunningServer } from '../tests/support/server';
import { rssMb, startRawServer, type RawServer } from './processes';

const LOAD_SECONDS = Number(process.env.BENCH_HTTP_SECONDS ?? 8);
const WARM_UP_SECONDS = 2;
/** What browsers send; API clients (requests, curl --compressed) send gzip. */
const ACCEPT_ENCODING = 'gzip, deflate, br';
const MIX_SECONDS = Number(process.env.BENCH_HTTP_MIX_SECONDS ?? 60);

interface Row {
	label: string;
	rps: number;
	p50: number;
	p99: number;
	max: number;
	errors: number;
	non2xx: number;
	kbPerAnswer: number;
}

/**
 * Runs autocannon; `paths` are handed out in turn, one per request, across all connections.
 * A short warm-up at the same load comes first, unrecorded (JIT, first renderings), unless the
 * row is about first visits.
 */
async function hammer(
	base: string,
	label: string,
	paths: string[],
	connections: number,
	seconds: number,
	warmUp = true
): Promise<Row> {
	let next = 0;
	const load = (duration: number) =>
		autocannon({
			url: base,
			connections,
			duration,
			headers: { 'accept-encoding': ACCEPT_ENCODING },
			requests: [
				{
					method: 'GET',
					setupRequest: (request) => ({
						...request,
						path: paths[next++ % paths.length] as string
					})
				}
			]
		});
	if (warmUp) await load(WARM_UP_SECONDS);
	const result = await load(seconds);
	const answers = result.requests.total || 1;
	return {
		label,
		rps: result.requests.average,
		p50: result.latency.p50,
		p99: result.latency.p99,
		max: result.latency.max,
		errors: result.errors + result.timeouts,
		non2xx: result.non2xx,
		kbPerAnswer: result.throughput.total / answers / 1024
	};
}

/** The URLs of a catalogue: a potential, an older version, the protein with most centres … */
function pickPaths(databasePath: string) {
	const db = new SQLite(databasePath, { readonly: true });
	const one = <T>(sql: string) => db.prepare(sql).get() as T;
	const all = <T>(sql: string) => db.prepare(sql).all() as T[];
	const potential = one<{ accession: string }>(
		`select accession from potential order by entry_id limit 1 offset 20`
	).accession;
	const protein = one<{ accession: string }>(
		`select e.accession from centre c join entry e on e.id = c.protein_entry_id
		 group by c.protein_entry_id order by count(*) desc, e.id limit 1`
	).accession;
	const older =
		one<{ accession: string } | undefined>(
			`select e.accession from entry e join entry_version v on v.entry_id = e.id
			 where e.kind in ('potential', 'protein') group by e.id having max(v.version) > 1 limit 1`
		)?.accession ?? potential;
	const entries = all<{ accession: string }>(
		`select accession from entry where kind <> 'source' and visibility = 'public'
		 order by id limit 5000`
	).map((r) => r.accession);
	db.close();
	const search = '/search?kind=fe4s4&phMin=6&phMax=9';
	const searches = [
		search,
		'/search?q=ferredoxin',
		'/search?kind=heme_c',
		'/search?emMin=-400&emMax=-200',
		'/search?q=hydrogenase&sort=em'
	];
	const api = '/api/v1/potentials?limit=100';
	const apis = [api, '/api/v1/proteins?limit=50', '/api/v1/facets', `/api/v1/entries/${potential}`];
	return {
		rows: [
			['/', ['/']],
			[`/e/${potential} (potential)`, [`/e/${potential}`]],
			[`/e/${older}/v1 (older version)`, [`/e/${older}/v1`]],
			[`/e/${protein} (protein, most centres)`, [`/e/${protein}`]],
			[search, [search]],
			[api, [api]],
			[`/api/v1/entries/${older}?version=1`, [`/api/v1/entries/${older}?version=1`]]
		] as [string, string[]][],
		entries,
		mix: [
			...entries.slice(0, 400).map((a) => `/e/${a}`),
			...searches.flatMap((s) => [s, s, s, s]),
			...apis.flatMap((a) => [a, a, a, a])
		]
	};
}

function table(rows: Row[], raw: Row): void {
	const pad = (s: string, n: number) => s.padStart(n);
	console.log(
		`  ${'URL'.padEnd(52)} ${pad('req/s', 8)} ${pad('× raw', 6)} ${pad('p50', 6)} ${pad('p99', 6)} ${pad('max', 6)} ${pad('KB', 6)} ${pad('errors', 6)} ${pad('non-2xx', 7)}`
	);
	for (const r of [raw, ...rows]) {
		console.log(
			`  ${r.label.slice(0, 52).padEnd(52)} ${pad(r.rps.toFixed(0), 8)} ${pad((r.rps / raw.rps).toFixed(2), 6)} ${pad(`${r.p50}ms`, 6)} ${pad(`${r.p99}ms`, 6)} ${pad(`${r.max}ms`, 6)} ${pad(r.kbPerAnswer.toFixed(1), 6)} ${pad(String(r.errors), 6)} ${pad(String(r.non2xx), 7)}`
		);
	}
}

async function benchCatalogue(
	name: string,
	databasePath: string,
	env: Record<string, string>,
	options: { mix: boolean; firstVisits: boolean }
): Promise<void> {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-http-'));
	const copy = join(dir, 'catalogue.sqlite');
	const source = new SQLite(databasePath);
	source.pragma('wal_checkpoint(TRUNCATE)'); // the copy must hold what the WAL still holds
	source.close();
	copyFileSync(databasePath, copy);
	let app: RunningServer | null = null;
	let raw: RawServer | null = null;
	try {
		app = await startServer(copy, env);
		raw = await startRawServer(copy);
		const paths = pickPaths(copy);
		const pid = app.process.pid as number;
		const rawRow = await hammer(
			raw.base,
			'raw node:http, 25-item JSON',
			['/small'],
			50,
			LOAD_SECONDS
		);
		const rows: Row[] = [
			await hammer(
				raw.base,
				'raw node:http + SQLite, list of 100',
				['/?limit=100'],
				50,
				LOAD_SECONDS
			)
		];
		for (const [label, list] of paths.rows)
			rows.push(await hammer(app.baseUrl, label, list, 50, LOAD_SECONDS));
		if (options.firstVisits) {
			// Every answer a first visit to its URL: nothing kept can serve it.
			const fresh = paths.entries.slice(400).map((a) => `/e/${a}`);
			rows.push(
				await hammer(
					app.baseUrl,
					`${fresh.length} different permalinks, first visits`,
					fresh,
					50,
					LOAD_SECONDS,
					false
				)
			);
		}
		console.log(`\n${name}: 50 connections, ${LOAD_SECONDS} s a row`);
		table(rows, rawRow);
		if (options.mix) {
			const mix = await hammer(
				app.baseUrl,
				`mix of ${new Set(paths.mix).size} URLs`,
				paths.mix,
				200,
				MIX_SECONDS
			);
			// The yardstick under the same crowd: raw node:http + SQLite over its list pages.
			const rawMix = await hammer(
				raw.base,
				'raw node:http + SQLite, 20 list pages',
				Array.from({ length: 20 }, (_, k) => `/?limit=25&offset=${k * 25}`),
				200,
				MIX_SECONDS
			);
			console.log(
				`\n${name}: 200 connections for ${MIX_SECONDS} s over the mix (permalinks, searches, API)`
			);
			table([rawMix, mix], rawRow);
		}
		console.log(`\n  server RSS after the runs: ${rssMb(pid).toFixed(0)} MB`);
	} finally {
		raw?.stop();
		await app?.stop();
		rmSync(dir, { recursive: true, force: true });
	}
}

/** The demo catalogue, as `npm run demo` serves it: the app seeds it on first start. */
async function demoCatalogue(): Promise<string> {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-demo-'));
	const path = join(dir, 'demo.sqlite');
	const app = await startServer(path, { HOPLINE_DEMO: 'true' });
	await app.stop();
	return path;
}

export async function benchHttp(largeCatalogue: string): Promise<void> {
	const demo = await demoCatalogue();
	console.log(
		'Ratios are to the first row, a raw node:http server answering a fixed small JSON body in the\n' +
			'same run. autocannon runs on the same machine as the server and takes one of its cores.\n' +
			`Requests are signed out and send Accept-Encoding: ${ACCEPT_ENCODING}, as browsers do;\n` +
			`each row is warmed up for ${WARM_UP_SECONDS} s first (not for first visits). KB: bytes on the wire per answer.`
	);
	await benchCatalogue(
		'Demo data',
		demo,
		{ HOPLINE_DEMO: 'true' },
		{ mix: true, firstVisits: false }
	);
	await benchCatalogue(
		'100 000-potential bench catalogue',
		largeCatalogue,
		{ HOPLINE_DEMO: 'false' },
		{ mix: false, firstVisits: true }
	);
}
