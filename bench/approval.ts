// Approving a large CSV batch (50 000 potentials by default) on a copy of the benchmark
// catalogue while other work goes on, as the review page does it: decideBatch given the
// database, so it commits in chunks (src/lib/server/curation/reviews.ts). For comparison the same
// batch is approved again inside one transaction, as before. Meanwhile a probe reads one
// potential every 20 ms (an entry page's query), another searches every 250 ms (listPotentials,
// which rebuilds its in-memory index when the catalogue revision moves), and another writes a
// saved search every 100 ms; each latency counts from when the probe was due, so waiting for a
// busy event loop is included. Figures are printed and written to bench/results/approval.json,
// never asserted.
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import type { Kysely } from 'kysely';
import { openDatabase } from '../src/lib/server/db/connect';
import { migrateToLatest } from '../src/lib/server/db/migrate';
import type { Database } from '../src/lib/server/db/schema';
import { checkUpload } from '../src/lib/server/uploads/checkUpload';
import { commitUpload } from '../src/lib/server/uploads/commitUpload';
import { uploadCsvLimits } from '../src/lib/server/uploads/readCsv';
import { APPROVAL_CHUNK_ROWS, decideBatch } from '../src/lib/server/curation/reviews';
import { listPotentials } from '../src/lib/server/catalogue/potentials';
import { benchUser, generatedPotentialsCsv } from './potentialsCsv';

const ROWS = Number(process.env.BENCH_APPROVAL_ROWS ?? 50_000);
const RESULTS = 'bench/results/approval.json';

interface Latencies {
	count: number;
	p50: number;
	p95: number;
	max: number;
}

function summary(values: number[]): Latencies {
	const sorted = [...values].sort((a, b) => a - b);
	const at = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] ?? 0;
	const round = (v: number) => Math.round(v * 10) / 10;
	return {
		count: sorted.length,
		p50: round(at(0.5)),
		p95: round(at(0.95)),
		max: round(sorted.at(-1) ?? 0)
	};
}

/**
 * Runs `probe` every `everyMs` until stopped. Each latency counts from when the probe was due,
 * so time spent waiting for the event loop (busy with a chunk of the approval) is included, as
 * it would be for a request arriving then.
 */
function repeat(everyMs: number, probe: () => Promise<unknown>) {
	const latencies: number[] = [];
	let running = true;
	const done = (async () => {
		let due = performance.now();
		while (running) {
			await probe();
			latencies.push(performance.now() - due);
			due = performance.now() + everyMs;
			await new Promise((resolve) => setTimeout(resolve, everyMs));
		}
	})();
	return {
		latencies,
		stop: async () => {
			running = false;
			await done;
		}
	};
}

interface ApprovalFigures {
	mode: 'chunks' | 'one transaction';
	rows: number;
	approvalSeconds: number;
	msPerRow: number;
	longestWriteTransactionMs: number;
	pointRead: Latencies;
	search: Latencies;
	writeWait: Latencies;
	eventLoopMaxMs: number;
}

async function approveWhileProbing(
	db: Kysely<Database>,
	mode: ApprovalFigures['mode'],
	writerHolds: number[]
): Promise<ApprovalFigures> {
	const { text } = await generatedPotentialsCsv(db, ROWS);
	const contributor = await benchUser(db, 'contributor', 'contributor@lab.test');
	const curator = await benchUser(db, 'curator', 'curator@lab.test');
	const check = await checkUpload(db, text, 'potential', { viewer: null, limits: uploadCsvLimits });
	const { submissionId } = await db.transaction().execute((trx) =>
		commitUpload(trx, contributor, check, {
			filename: 'approval.csv',
			visibility: { visibility: 'public', groupId: null, embargoUntil: null },
			changeNote: null,
			origin: 'http://bench.test',
			pendingRowsMax: 1_000_000
		})
	);
	const { maxId } = await db
		.selectFrom('potential')
		.select((eb) => eb.fn.max('entry_id').as('maxId'))
		.executeTakeFirstOrThrow();
	await listPotentials(db, { kind: ['fe4s4'] }, { limit: 25, offset: 0 }, null); // index built
	let n = 0;
	writerHolds.length = 0;
	const delay = monitorEventLoopDelay({ resolution: 10 });
	delay.enable();
	const reads = repeat(20, () =>
		db
			.selectFrom('potential')
			.selectAll()
			.where('entry_id', '=', 1 + ((n++ * 7919) % (maxId ?? 1)))
			.executeTakeFirst()
	);
	const searches = repeat(250, () =>
		listPotentials(db, { kind: ['fe4s4'], emMin: -400 }, { limit: 25, offset: 0 }, null)
	);
	const writes = repeat(100, () =>
		db
			.insertInto('saved_search')
			.values({ user_id: curator.id, name: 'probe', query: 'kind=fe4s4' })
			.execute()
	);
	const decision = { returnRows: [], comment: '' };
	const start = performance.now();
	const outcome =
		mode === 'chunks'
			? await decideBatch(db, curator, submissionId, decision, 'http://bench.test')
			: await db
					.transaction()
					.execute((trx) => decideBatch(trx, curator, submissionId, decision, 'http://bench.test'));
	const seconds = (performance.now() - start) / 1000;
	// The writer's holds during the approval (the probes' own are a few milliseconds).
	const longest = Math.max(...writerHolds);
	await Promise.all([reads.stop(), searches.stop(), writes.stop()]);
	delay.disable();
	if (outcome.approved.length !== ROWS) throw new Error(`approved ${outcome.approved.length}`);
	return {
		mode,
		rows: ROWS,
		approvalSeconds: Math.round(seconds * 10) / 10,
		msPerRow: Math.round((seconds / ROWS) * 1e5) / 100,
		longestWriteTransactionMs: Math.round(longest),
		pointRead: summary(reads.latencies),
		search: summary(searches.latencies),
		writeWait: summary(writes.latencies),
		eventLoopMaxMs: Math.round(delay.max / 1e6)
	};
}

function print(f: ApprovalFigures): void {
	const l = (x: Latencies) => `p50 ${x.p50} ms, p95 ${x.p95} ms, max ${x.max} ms (${x.count})`;
	console.log(`  ${f.mode}:`);
	console.log(
		`    approval ${f.approvalSeconds} s (${f.msPerRow} ms a row); longest write transaction ${f.longestWriteTransactionMs} ms`
	);
	console.log(`    point read every 20 ms   ${l(f.pointRead)}`);
	console.log(`    search every 250 ms      ${l(f.search)}`);
	console.log(`    small write every 100 ms ${l(f.writeWait)}`);
	console.log(`    event loop: longest stall ${f.eventLoopMaxMs} ms`);
}

export async function benchApproval(dataset: string): Promise<void> {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-approval-'));
	try {
		console.log(
			`\nApproving a ${ROWS.toLocaleString('en')}-row CSV batch while reading, searching and writing (chunks of ${APPROVAL_CHUNK_ROWS})`
		);
		const figures: ApprovalFigures[] = [];
		for (const mode of ['chunks', 'one transaction'] as const) {
			// Each mode on its own copy of the catalogue.
			const path = join(dir, `${figures.length}.sqlite`);
			copyFileSync(dataset, path);
			if (existsSync(`${dataset}-wal`)) copyFileSync(`${dataset}-wal`, `${path}-wal`);
			const writerHolds: number[] = [];
			const db = openDatabase(path, { onWriterReleased: (ms) => writerHolds.push(ms) });
			try {
				await migrateToLatest(db);
				const f = await approveWhileProbing(db, mode, writerHolds);
				print(f);
				figures.push(f);
			} finally {
				await db.destroy();
			}
		}
		mkdirSync('bench/results', { recursive: true });
		writeFileSync(
			RESULTS,
			JSON.stringify({ at: new Date().toISOString(), dataset, figures }, null, '\t') + '\n'
		);
		console.log(`  written to ${RESULTS}`);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}
