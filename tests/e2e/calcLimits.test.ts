import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { ApiErrorBody } from '$lib/schemas/apiError';
import { MAX_GRID_POINTS, MAX_POTENTIAL_SAMPLES, MAX_TITRATION_POINTS } from '$lib/schemas/calc';
import { signInCookie } from '../support/session';
import { startServer, type RunningServer } from '../support/server';

// Calculations run in worker threads: the server keeps answering while they run, refuses work
// beyond its queue (503), limits anonymous callers per address (429), stops a calculation at
// its time limit (422) and refuses inputs larger than the methods need (400).

/** About a second of work on an idle 2-core machine: three DVR solutions on the largest grid. */
const HEAVY = {
	points: MAX_GRID_POINTS,
	levels: 20,
	potential: { kind: 'double-well', barrierKcalMol: 8, halfSeparationA: 0.35 }
};
/** Microseconds of work: the barrier factors only. */
const LIGHT = { imagFreqCm1: 1000, barrierKJmol: 40 };

function post(base: string, path: string, body: unknown, headers: Record<string, string> = {}) {
	return fetch(base + path, {
		method: 'POST',
		headers: { 'content-type': 'application/json', origin: base, ...headers },
		body: JSON.stringify(body)
	});
}

function postForm(base: string, path: string, fields: Record<string, string>, cookie?: string) {
	return fetch(base + path, {
		method: 'POST',
		headers: {
			'content-type': 'application/x-www-form-urlencoded',
			// As a browser without JavaScript: the page, with the action's status.
			accept: 'text/html',
			origin: base,
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(fields)
	});
}

const titrationPoints = (count: number) =>
	Array.from({ length: count }, (_, i) => ({
		potentialMv: -500 + (500 * i) / count,
		signal: 1 / (1 + Math.exp((-500 + (500 * i) / count + 250) / 25.7))
	}));

describe('calculations and the rest of the server (shared test server)', () => {
	const base = inject('baseUrl');

	it('answers a trivial GET while three heavy calculations are still running', async () => {
		const done: string[] = [];
		const heavy = [1, 2, 3].map((i) =>
			post(base, '/api/v1/calc/tunnelling', HEAVY).then(async (res) => {
				done.push(`heavy ${i}`);
				return { status: res.status, body: await res.text() };
			})
		);
		await new Promise((r) => setTimeout(r, 300)); // let them reach the server and start
		const res = await fetch(`${base}/api/v1`);
		done.push('get');
		expect(res.status).toBe(200);
		// Before the fix the GET waited behind at least one whole calculation on the event loop.
		expect(done).toEqual(['get']);
		for (const result of await Promise.all(heavy)) {
			expect(result.status, result.body).toBe(200);
			expect(JSON.parse(result.body).levels.energiesKcalMol).toHaveLength(20);
		}
	});

	it('refuses inputs larger than the methods need, naming the field and the limit', async () => {
		const titration = await post(base, '/api/v1/calc/titration', {
			points: titrationPoints(MAX_TITRATION_POINTS + 1)
		});
		expect(titration.status).toBe(400);
		const t = (await titration.json()) as ApiErrorBody;
		expect(t.error.fields?.points?.[0]).toContain(`at most ${MAX_TITRATION_POINTS} points`);

		const grid = await post(base, '/api/v1/calc/tunnelling', {
			...HEAVY,
			points: MAX_GRID_POINTS + 1
		});
		expect(grid.status).toBe(400);
		const g = (await grid.json()) as ApiErrorBody;
		expect(g.error.fields?.points?.[0]).toContain(`to ${MAX_GRID_POINTS}`);

		const samples = Array.from({ length: MAX_POTENTIAL_SAMPLES + 1 }, (_, i) => ({
			xA: -1 + (2 * i) / MAX_POTENTIAL_SAMPLES,
			energyKcalMol: 8 * ((-1 + (2 * i) / MAX_POTENTIAL_SAMPLES) ** 2 - 1) ** 2
		}));
		const sampled = await post(base, '/api/v1/calc/tunnelling', {
			potential: { kind: 'points', points: samples }
		});
		expect(sampled.status).toBe(400);
		const s = (await sampled.json()) as ApiErrorBody;
		expect(s.error.fields?.['potential.points']?.[0]).toContain(
			`at most ${MAX_POTENTIAL_SAMPLES} points`
		);

		// The page says the same beside its text box.
		const rows = titrationPoints(MAX_TITRATION_POINTS + 1).map(
			(p) => `${p.potentialMv},${p.signal}`
		);
		const page = await postForm(base, '/calc/titration', {
			points: rows.join('\n'),
			components: '1',
			n: '1',
			temperatureK: '298.15'
		});
		expect(page.status).toBe(400);
		expect(await page.text()).toContain(`at most ${MAX_TITRATION_POINTS} rows`);
	});
});

describe('calculation limits (a server of their own: one worker, a queue of one)', () => {
	const dir = mkdtempSync(join(tmpdir(), 'hopline-calc-'));
	let server: RunningServer;
	let base: string;
	let reader: string;
	beforeAll(async () => {
		server = await startServer(join(dir, 'calc.sqlite'), {
			CALC_WORKERS: '1',
			CALC_QUEUE_MAX: '1',
			CALC_TIME_LIMIT_MS: '300',
			CALC_ANON_PER_MINUTE: '3'
		});
		base = server.baseUrl;
		// Signed-in callers are not counted per address, so the queue and time-limit checks
		// below are not mixed up with the per-address limit (all requests come from 127.0.0.1).
		reader = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
	});
	afterAll(async () => {
		await server?.stop();
		rmSync(dir, { recursive: true, force: true });
	});

	it('stops a calculation at its time limit, and the next one runs on a fresh worker', async () => {
		const res = await post(base, '/api/v1/calc/tunnelling', HEAVY, { cookie: reader });
		expect(res.status).toBe(422);
		const body = (await res.json()) as ApiErrorBody;
		expect(body.error.code).toBe('time_limit_exceeded');
		expect(body.error.message).toMatch(/stopped after 300 ms/);
		const next = await post(base, '/api/v1/calc/tunnelling', LIGHT, { cookie: reader });
		expect(next.status).toBe(200);
		expect((await next.json()).kappa.wigner).toBeGreaterThan(1);
	});

	it('answers 503 with Retry-After, on the API and on a page, when the queue is full', async () => {
		// Two heavy jobs outstanding at all times: one runs (until its 300 ms limit), one waits,
		// and each is sent again as soon as it ends, so the queue stays full however slowly a
		// loaded machine serves them. No fixed sleep: the probes below are repeated until the
		// full queue is observed (a refusal), each within bounds of count and time.
		const deadline = Date.now() + 40_000;
		let occupying = true;
		const occupierStatuses: number[] = [];
		const occupy = async () => {
			for (let i = 0; i < 200 && occupying && Date.now() < deadline; i++) {
				const res = await post(base, '/api/v1/calc/tunnelling', HEAVY, { cookie: reader });
				occupierStatuses.push(res.status);
				await res.body?.cancel();
			}
		};
		const occupiers = [occupy(), occupy()];
		/** Sends `probe` until it is refused; a probe that found room must have been served. */
		const untilRefused = async (probe: () => Promise<Response>) => {
			const served: number[] = [];
			for (let i = 0; i < 50 && Date.now() < deadline; i++) {
				const res = await probe();
				if (res.status === 503) return { res, served };
				served.push(res.status);
				await res.body?.cancel();
			}
			throw new Error(`never refused while the queue was kept full; answers: ${served}`);
		};
		let api: Awaited<ReturnType<typeof untilRefused>>;
		let page: Awaited<ReturnType<typeof untilRefused>>;
		try {
			api = await untilRefused(() =>
				post(base, '/api/v1/calc/tunnelling', LIGHT, { cookie: reader })
			);
			page = await untilRefused(() =>
				postForm(base, '/calc/tunnelling', { imagFreqCm1: '900', potentialKind: 'none' }, reader)
			);
		} finally {
			occupying = false;
			await Promise.all(occupiers);
		}
		// Probes that came in a moment the queue had room were computed, nothing else.
		expect([...api.served, ...page.served].every((status) => status === 200)).toBe(true);
		expect(api.res.status).toBe(503);
		expect(Number(api.res.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		const body = (await api.res.json()) as ApiErrorBody;
		expect(body.error).toMatchObject({
			code: 'unavailable',
			message: expect.stringMatching(/busy/)
		});
		expect(page.res.status).toBe(503);
		expect(Number(page.res.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		expect(await page.res.text()).toMatch(/The calculators are busy; try again in \d+ s/);
		// The occupying ones end at their time limit (or are refused when a probe had taken the
		// place in the queue); nothing waits for ever — every one has answered by now.
		expect(occupierStatuses.filter((status) => status === 422).length).toBeGreaterThanOrEqual(2);
		expect(occupierStatuses.every((status) => status === 422 || status === 503)).toBe(true);
	});

	it('answers 429 with Retry-After to an address over its limit without an account', async () => {
		for (let i = 0; i < 3; i++) {
			expect((await post(base, '/api/v1/calc/tunnelling', LIGHT)).status).toBe(200);
		}
		const api = await post(base, '/api/v1/calc/tunnelling', LIGHT);
		expect(api.status).toBe(429);
		const retryAfter = Number(api.headers.get('retry-after'));
		expect(retryAfter).toBeGreaterThanOrEqual(1);
		expect(retryAfter).toBeLessThanOrEqual(60);
		const body = (await api.json()) as ApiErrorBody;
		expect(body.error).toMatchObject({
			code: 'too_many_requests',
			message: expect.stringMatching(/3 calculations a minute/)
		});
		const page = await postForm(base, '/calc/titration', {
			points: '-400,1\n-300,0.9\n-200,0.1\n-100,0\n0,0',
			components: '1',
			n: '1',
			temperatureK: '298.15'
		});
		expect(page.status).toBe(429);
		expect(page.headers.get('retry-after')).not.toBeNull();
		expect(await page.text()).toMatch(/3 calculations a minute/);
		// The same address, signed in, is not counted.
		expect((await post(base, '/api/v1/calc/tunnelling', LIGHT, { cookie: reader })).status).toBe(
			200
		);
	});
});
