// `npm run bench:signin` (after `npm run build`): sign-in figures, printed, never asserted.
// 1. how long /signin and Auth.js's /auth/callback/password take to refuse a wrong password for
//    an existing account and for an unknown one (they should match: one hash either way), and a
//    successful sign-in;
// 2. server RSS and answers during 16 concurrent wrong guesses (at one existing account, and at
//    16 unknown ones), and a real sign-in during and after them.
// The server runs on a temporary database with the demo accounts; each request comes from its
// own client address (ADDRESS_HEADER), so the per-address limit does not interfere.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer } from '../tests/support/server';

const dir = mkdtempSync(join(tmpdir(), 'hopline-bench-signin-'));
const server = await startServer(join(dir, 'bench.sqlite'), { ADDRESS_HEADER: 'x-bench-client' });
const base = server.baseUrl;
let clients = 0;

function post(path: string, fields: Record<string, string>, form: boolean) {
	return fetch(base + path, {
		method: 'POST',
		headers: {
			origin: base,
			'content-type': 'application/x-www-form-urlencoded',
			'x-bench-client': `198.51.100.${++clients % 250}`,
			...(form ? { 'x-sveltekit-action': 'true' } : {})
		},
		body: new URLSearchParams(fields),
		redirect: 'manual'
	});
}

async function timed(path: string, email: string, password: string, form: boolean) {
	const start = performance.now();
	const res = await post(path, { email, password, redirectTo: '/', callbackUrl: '/' }, form);
	await res.arrayBuffer();
	return performance.now() - start;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (v: number) => `${v.toFixed(0)} ms`;
const rssMb = () =>
	Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${server.process.pid}/status`, 'utf8'))?.[1]) /
	1024;

/** 16 concurrent wrong guesses from 16 client addresses, with a real sign-in sent 50 ms in. */
async function burst(label: string, emailFor: (i: number) => string) {
	console.log(`\n16 concurrent wrong guesses, ${label}:`);
	const before = rssMb();
	let peak = before;
	const sampler = setInterval(() => (peak = Math.max(peak, rssMb())), 20);
	const burstStart = performance.now();
	const guesses = Promise.all(
		Array.from({ length: 16 }, (_, i) =>
			post('/auth/callback/password', { email: emailFor(i), password: `guess-${i}` }, false)
		)
	);
	await new Promise((r) => setTimeout(r, 50));
	const during = performance.now();
	const real = await post(
		'/signin',
		{ email: 'admin@demo.hopline.test', password: 'demo-admin-pass', redirectTo: '/' },
		true
	);
	const realAnswer = ((await real.json()) as { type: string }).type;
	const realMs = performance.now() - during;
	const answers = await guesses;
	const burstMs = performance.now() - burstStart;
	clearInterval(sampler);
	const codes = new Map<string, number>();
	for (const r of answers) {
		const code = /code=(\w+)/.exec(r.headers.get('location') ?? '')?.[1] ?? String(r.status);
		codes.set(code, (codes.get(code) ?? 0) + 1);
	}
	console.log(
		`  RSS ${before.toFixed(0)} MB before, peak ${peak.toFixed(0)} MB; all answered in ${ms(burstMs)}: ${[...codes].map(([c, n]) => `${n} ${c}`).join(', ')}`
	);
	console.log(
		`  a real sign-in sent during the burst: ${realAnswer === 'redirect' ? 'signed in' : `not signed in (${realAnswer})`} in ${ms(realMs)}`
	);
	const after = await timed('/signin', 'admin@demo.hopline.test', 'demo-admin-pass', true);
	console.log(`  the same sign-in after the burst: ${ms(after)}`);
}

try {
	console.log('Refusing a wrong password (median of 4; the account limit is 5):');
	for (const [label, path, form, account] of [
		['/signin form', '/signin', true, 'curator@demo.hopline.test'],
		['POST /auth/callback/password', '/auth/callback/password', false, 'reader@demo.hopline.test']
	] as const) {
		const existing: number[] = [];
		const unknown: number[] = [];
		for (let i = 0; i < 4; i++) {
			existing.push(await timed(path, account, `wrong-${label}-${i}`, form));
			unknown.push(
				await timed(path, `nobody-${form ? 'form' : 'authjs'}-${i}@bench.test`, 'wrong', form)
			);
		}
		console.log(
			`  ${label}: existing account ${ms(median(existing))}, unknown account ${ms(median(unknown))}`
		);
	}
	const ok = await timed('/signin', 'admin@demo.hopline.test', 'demo-admin-pass', true);
	console.log(`  a successful sign-in through /signin: ${ms(ok)}`);

	await burst('one existing account', () => 'contributor@demo.hopline.test');
	await burst('16 unknown accounts', (i) => `guess-${i}@bench.test`);
} finally {
	await server.stop();
	rmSync(dir, { recursive: true, force: true });
}
