import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import SwaggerParser from '@apidevtools/swagger-parser';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { OpenApiDocument, OpenApiOperation, OpenApiResponse } from '$lib/server/openapi/types';
import { launchChromium } from '../support/browser';
import { documentValidator, type DocumentValidator } from '../support/openapiValidator';
import { pngOf } from '../support/hostileFiles';
import { signInCookie } from '../support/session';

/*
 * The OpenAPI document as the production build serves it, and real answers of every operation
 * checked against the document's own schemas (ajv, JSON Schema 2020-12): a sample request per
 * operation, with the document's example inputs where the demo data allows, and a failure of
 * this test when an operation of the document has no sample here.
 */

const base = inject('baseUrl');
let doc: OpenApiDocument;
let validator: DocumentValidator;
let contributor = '';
let reader = '';

beforeAll(async () => {
	const res = await fetch(`${base}/api/v1/openapi.json`);
	doc = (await res.json()) as OpenApiDocument;
	validator = documentValidator(doc);
	contributor = await signInCookie(base, 'contributor@demo.hopline.test', 'demo-contributor-pass');
	reader = await signInCookie(base, 'reader@demo.hopline.test', 'demo-reader-pass');
});

function operation(id: string): { path: string; method: string; op: OpenApiOperation } {
	for (const [path, item] of Object.entries(doc.paths))
		for (const [method, op] of Object.entries(item) as [string, OpenApiOperation][])
			if (op.operationId === id) return { path, method, op };
	throw new Error(`no operation ${id} in the document`);
}

/** The document's example query of an operation, as its parameters give them. */
function exampleQuery(id: string): string {
	const params = new URLSearchParams();
	for (const p of operation(id).op.parameters ?? [])
		if (p.in === 'query' && p.example !== undefined)
			params.set(p.name, Array.isArray(p.example) ? p.example.join(',') : String(p.example));
	return params.size ? `?${params}` : '';
}

function exampleBody(id: string): unknown {
	return operation(id).op.requestBody?.content['application/json']?.example;
}

const checked = new Map<string, Set<number>>();

/**
 * Sends the request and checks the answer against the operation's response for its status:
 * the status must be documented, the content type one of the documented ones, and a JSON body
 * must validate against the schema.
 */
async function sample(id: string, path: string, init: RequestInit = {}): Promise<Response> {
	const { op } = operation(id);
	const res = await fetch(base + path, init);
	const documented = op.responses[String(res.status)];
	expect(documented, `${id} ${path}: status ${res.status} is not documented`).toBeDefined();
	const response = (
		documented && '$ref' in documented
			? doc.components.responses[documented.$ref.split('/').at(-1) ?? '']
			: documented
	) as OpenApiResponse;
	const type = (res.headers.get('content-type') ?? '').split(';')[0] as string;
	if (res.status === 304) return res;
	if (res.status === 204) {
		// No content: nothing to validate beyond the status being documented.
		expect(response.content, `${id} ${path}: 204 documents no body`).toBeUndefined();
		checked.set(id, (checked.get(id) ?? new Set()).add(204));
		return res;
	}
	expect(Object.keys(response.content ?? {}), `${id} ${path}`).toContain(type);
	if (type === 'application/json') {
		const body: unknown = await res.clone().json();
		const schema = response.content?.[type]?.schema;
		expect(validator.validate(schema, body).errors, `${id} ${path} (${res.status})`).toEqual([]);
	}
	const statuses = checked.get(id) ?? new Set();
	checked.set(id, statuses.add(res.status));
	return res;
}

const json = (cookie: string, body: unknown): RequestInit => ({
	method: 'POST',
	headers: { origin: base, cookie, 'content-type': 'application/json' },
	body: JSON.stringify(body)
});

describe('GET /api/v1/openapi.json (production build)', () => {
	it('is a valid OpenAPI 3.1 document naming this server', async () => {
		const api = await SwaggerParser.validate(JSON.parse(JSON.stringify(doc)));
		expect('openapi' in api && api.openapi).toBe('3.1.0');
		expect(doc.servers[0]?.url).toBe(`${base}/api/v1`);
	});

	it('carries a strong ETag and answers If-None-Match with 304', async () => {
		const first = await sample('getOpenApiDocument', '/api/v1/openapi.json');
		const etag = first.headers.get('etag') ?? '';
		expect(etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
		expect(first.headers.get('content-type')).toMatch(/^application\/json/);
		const again = await sample('getOpenApiDocument', '/api/v1/openapi.json', {
			headers: { 'if-none-match': etag }
		});
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		// Compressed, it is another representation with its own ETag, and the same document.
		const br = await fetch(`${base}/api/v1/openapi.json`, {
			headers: { 'accept-encoding': 'br' }
		});
		expect(br.headers.get('content-encoding')).toBe('br');
		expect(br.headers.get('etag')).not.toBe(etag);
		expect(await br.json()).toEqual(doc);
	});
});

describe('answers of every operation validate against the document', () => {
	const accessions: Record<string, string> = {};

	it('suggestions for reference fields (the document example finds one; a bad type is a 400)', async () => {
		const res = await sample(
			'suggestEntries',
			`/api/v1/suggestions${exampleQuery('suggestEntries')}`
		);
		expect(res.status).toBe(200);
		expect(((await res.json()) as { items: unknown[] }).items.length).toBeGreaterThan(0);
		const bad = await sample('suggestEntries', '/api/v1/suggestions?type=potential&q=N2');
		expect(bad.status).toBe(400);
	});

	it('lists: potentials, proteins, centres, spin records, distances (JSON and CSV)', async () => {
		for (const id of [
			'listPotentials',
			'listProteins',
			'listCentres',
			'listSpinRecords',
			'listDistances'
		]) {
			const { path } = operation(id);
			const res = await sample(id, `/api/v1${path}${exampleQuery(id)}`);
			expect(res.status, id).toBe(200);
			const page = (await res.json()) as { items: unknown[]; total: number };
			expect(page.total, `${id}: the document's example finds rows`).toBeGreaterThan(0);
			const all = (await (await sample(id, `/api/v1${path}?limit=3`)).json()) as {
				items: Record<string, { accession: string } | string>[];
			};
			const first = all.items[0] as Record<string, unknown>;
			accessions[id] = first.accession as string;
			if (id === 'listPotentials') {
				accessions.protein = (first.protein as { accession: string }).accession;
				accessions.centre = (first.centre as { accession: string }).accession;
				const source = all.items.find((i) => i.source)?.source as { accession: string };
				accessions.source = source.accession;
			}
			const csv = await sample(id, `/api/v1${path}?format=csv&limit=2`);
			expect(csv.headers.get('content-type'), id).toMatch(/^text\/csv/);
			const bad = await sample(id, `/api/v1${path}?limit=0`);
			expect(bad.status).toBe(400);
		}
	});

	it('one entry of every kind, and a missing one', async () => {
		const kinds = {
			protein: accessions.protein,
			centre: accessions.centre,
			potential: accessions.listPotentials,
			spin_record: accessions.listSpinRecords,
			distance: accessions.listDistances,
			source: accessions.source
		};
		for (const [kind, accession] of Object.entries(kinds)) {
			const res = await sample('getEntry', `/api/v1/entries/${accession}?version=1`);
			expect(((await res.json()) as { kind: string }).kind).toBe(kind);
		}
		expect((await sample('getEntry', '/api/v1/entries/HL999999')).status).toBe(404);
		expect((await sample('getEntry', `/api/v1/entries/${kinds.potential}?version=x`)).status).toBe(
			400
		);
	});

	it('facets, the index and the calculators with the document’s examples', async () => {
		expect((await sample('getFacets', '/api/v1/facets')).status).toBe(200);
		const exported = await sample('exportPotentials', '/api/v1/potentials/export?kind=fe4s4');
		expect(exported.status).toBe(200);
		const csv = (await exported.text()).trim().split(/\r?\n/);
		expect(csv.length - 1).toBe(Number(exported.headers.get('x-total-count')));
		expect((await sample('exportPotentials', '/api/v1/potentials/export?sort=x')).status).toBe(400);
		const index = await sample('getIndex', '/api/v1');
		expect(((await index.json()) as { endpoints: unknown[] }).endpoints).toHaveLength(
			Object.values(doc.paths).flatMap((i) => Object.keys(i)).length
		);
		const hop = await sample(
			'calculateHopRate',
			`/api/v1/calc/hop-rate${exampleQuery('calculateHopRate')}`
		);
		expect(hop.status).toBe(200);
		expect((await sample('calculateHopRate', '/api/v1/calc/hop-rate?distance=9')).status).toBe(400);
		for (const id of ['fitTitration', 'calculateTunnelling']) {
			const res = await sample(id, `/api/v1${operation(id).path}`, json('', exampleBody(id)));
			expect(res.status, id).toBe(200);
			expect((await sample(id, `/api/v1${operation(id).path}`, json('', {}))).status).toBe(400);
		}
		// Levels of a double well: the largest answer of the tunnelling calculator.
		const levels = await sample(
			'calculateTunnelling',
			'/api/v1/calc/tunnelling',
			json('', {
				potential: { kind: 'double-well', barrierKcalMol: 8, halfSeparationA: 0.35 },
				points: 120
			})
		);
		expect(((await levels.json()) as { levels: unknown }).levels).not.toBeNull();
	});

	it('contributor endpoints: a submission, its view, a CSV check; 401 and 403', async () => {
		const body = exampleBody('createSubmission') as { data: Record<string, unknown> };
		// The example's couple is a [4Fe-4S] couple: deposit it on such a centre of the demo data.
		const centres = (await (await fetch(`${base}/api/v1/centres?kind=fe4s4&limit=1`)).json()) as {
			items: { accession: string }[];
		};
		const created = await sample(
			'createSubmission',
			'/api/v1/submissions',
			json(contributor, {
				...body,
				data: { ...body.data, centreAccession: centres.items[0]?.accession }
			})
		);
		expect(created.status, await created.clone().text()).toBe(201);
		const { id } = (await created.json()) as { id: number };
		expect(
			(
				await sample('getSubmission', `/api/v1/submissions/${id}`, {
					headers: { cookie: contributor }
				})
			).status
		).toBe(200);
		expect((await sample('getSubmission', `/api/v1/submissions/${id}`)).status).toBe(401);
		expect(
			(await sample('getSubmission', `/api/v1/submissions/${id}`, { headers: { cookie: reader } }))
				.status
		).toBe(403);
		expect(
			(
				await sample(
					'createSubmission',
					'/api/v1/submissions',
					json(contributor, { kind: 'potential', data: {} })
				)
			).status
		).toBe(400);
		expect(
			(await sample('createSubmission', '/api/v1/submissions', json(reader, body))).status
		).toBe(403);

		const upload = () => {
			const form = new FormData();
			form.set('kind', 'potential');
			const text = readFileSync('tests/fixtures/csv/potentials-bad.csv');
			form.set('file', new Blob([text], { type: 'text/csv' }), 'potentials-bad.csv');
			return { method: 'POST', headers: { origin: base, cookie: contributor }, body: form };
		};
		const check = await sample('checkUpload', '/api/v1/uploads/check', upload());
		expect(check.status).toBe(200);
		const report = await sample('checkUpload', '/api/v1/uploads/check?format=csv', upload());
		expect(report.headers.get('content-type')).toMatch(/^text\/csv/);
		expect((await sample('checkUpload', '/api/v1/uploads/check?format=xml', upload())).status).toBe(
			400
		);
		// Its query is parsed by its schema like every other: an unknown parameter is an error.
		const unknown = await sample('checkUpload', '/api/v1/uploads/check?colour=red', upload());
		expect(unknown.status).toBe(400);

		// Files on the submission: attach (201), its view lists it, a refused file (415), remove (204).
		const png = await pngOf(120, 80);
		const attachForm = (file: Uint8Array, name: string) => {
			const form = new FormData();
			form.set('kind', 'voltammogram');
			form.set('caption', 'Protein-film voltammogram, 20 mV/s');
			form.set('scanRateMvPerS', '20');
			form.set('referenceElectrode', 'SHE');
			form.set('file', new Blob([Buffer.from(file)], { type: 'image/png' }), name);
			return { method: 'POST', headers: { origin: base, cookie: contributor }, body: form };
		};
		// The example goes straight into review, where files are frozen (409): a draft takes them.
		const draft = await sample(
			'createSubmission',
			'/api/v1/submissions',
			json(contributor, {
				...body,
				data: { ...body.data, centreAccession: centres.items[0]?.accession },
				submit: false
			})
		);
		const draftId = ((await draft.json()) as { id: number }).id;
		const frozen = await sample(
			'attachToSubmission',
			`/api/v1/submissions/${id}/attachments`,
			attachForm(png, 'cv.png')
		);
		expect(frozen.status).toBe(409);
		const filesUrl = `/api/v1/submissions/${draftId}/attachments`;
		const attached = await sample('attachToSubmission', filesUrl, attachForm(png, 'cv.png'));
		expect(attached.status, await attached.clone().text()).toBe(201);
		const attachment = (await attached.json()) as { id: number };
		const withFiles = await sample('getSubmission', `/api/v1/submissions/${draftId}`, {
			headers: { cookie: contributor }
		});
		expect(
			((await withFiles.json()) as { versions: { attachments: { id: number }[] }[] }).versions[0]
				?.attachments[0]?.id
		).toBe(attachment.id);
		const html = new TextEncoder().encode('<!doctype html><html><body>x</body></html>');
		expect((await sample('attachToSubmission', filesUrl, attachForm(html, 'x.png'))).status).toBe(
			415
		);
		const remove = (cookie: string) => ({
			method: 'DELETE',
			headers: { origin: base, cookie }
		});
		expect(
			(await sample('detachFromSubmission', `${filesUrl}/${attachment.id}`, remove(reader))).status
		).toBe(403);
		expect(
			(await sample('detachFromSubmission', `${filesUrl}/${attachment.id}`, remove(contributor)))
				.status
		).toBe(204);
		expect(
			(await sample('detachFromSubmission', `${filesUrl}/${attachment.id}`, remove(contributor)))
				.status
		).toBe(404);
	});

	it('covered every operation of the document', () => {
		const all = Object.values(doc.paths).flatMap((item) =>
			(Object.values(item) as OpenApiOperation[]).map((op) => op.operationId)
		);
		const success = (id: string) => {
			const { responses } = operation(id).op;
			return responses['201'] ? 201 : responses['204'] ? 204 : 200;
		};
		const missing = all.filter((id) => !checked.get(id)?.has(success(id)));
		expect(missing).toEqual([]);
	});
});

describe('code samples run against the server', () => {
	/** Samples that need no token (the contributor endpoints need one and are run above). */
	function samplesIn(label: string) {
		return Object.values(doc.paths).flatMap((item) =>
			(Object.values(item) as OpenApiOperation[])
				.filter((op) => op.security.some((s) => Object.keys(s).length === 0))
				.flatMap((op) =>
					op['x-codeSamples']
						.filter((s) => s.label === label)
						.map((s) => ({ op: op.operationId, source: s.source }))
				)
		);
	}

	function runAll(command: string, extension: string, label: string) {
		const dir = mkdtempSync(join(tmpdir(), 'hopline-run-'));
		try {
			const samples = samplesIn(label);
			expect(samples.length).toBeGreaterThanOrEqual(10);
			for (const s of samples) {
				const file = join(dir, `${s.op}.${extension}`);
				writeFileSync(file, s.source);
				const run = spawnSync(command, [file], { timeout: 60_000 });
				expect(run.status, `${s.op}: ${run.stderr}`).toBe(0);
			}
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	}

	// The first Python that has both (a version manager's python3 may come before Debian's).
	const python = ['python3', '/usr/bin/python3'].find(
		(p) => spawnSync(p, ['-c', 'import pandas, requests']).status === 0
	);
	const hasPandas = python !== undefined;
	const hasHttr2 = spawnSync('Rscript', ['-e', 'library(httr2); library(jsonlite)']).status === 0;
	if (!hasPandas)
		console.warn('python3 with requests and pandas not found: Python samples not run');
	if (!hasHttr2) console.warn('Rscript with httr2 and jsonlite not found: R samples not run');

	it.runIf(hasPandas)(
		'Python (requests, pandas)',
		() => runAll(python as string, 'py', 'Python'),
		120_000
	);
	it.runIf(hasHttr2)('R (httr2, jsonlite)', () => runAll('Rscript', 'R', 'R'), 180_000);

	it.runIf(hasPandas)(
		'the README’s Python snippet',
		() => {
			const readme = readFileSync('README.md', 'utf8');
			const snippet = /## API[\s\S]*?```python\n([\s\S]*?)```/.exec(readme)?.[1];
			expect(snippet).toBeDefined();
			const dir = mkdtempSync(join(tmpdir(), 'hopline-readme-'));
			try {
				const file = join(dir, 'readme.py');
				writeFileSync(file, (snippet as string).replaceAll('http://127.0.0.1:3000', base));
				const run = spawnSync(python as string, [file], { timeout: 60_000 });
				expect(run.status, run.stderr.toString()).toBe(0);
				expect(run.stdout.toString()).toMatch(/\d+ potentials/);
			} finally {
				rmSync(dir, { recursive: true, force: true });
			}
		},
		60_000
	);
});

describe('the /api reference page (Chromium)', () => {
	let browser: Browser;
	beforeAll(async () => {
		browser = await launchChromium();
	});
	afterAll(async () => {
		await browser.close();
	});

	for (const width of [1366, 390]) {
		it(`shows every operation of the document at ${width} px`, async () => {
			const context = await browser.newContext({ baseURL: base, viewport: { width, height: 900 } });
			const page = await context.newPage();
			await page.goto('/api');
			const shown = await page
				.getByTestId('operation')
				.evaluateAll((els) => els.map((e) => `${e.dataset.method} ${e.dataset.path}`));
			const documented = Object.entries(doc.paths).flatMap(([path, item]) =>
				Object.keys(item).map((m) => `${m.toUpperCase()} /api/v1${path === '/' ? '' : path}`)
			);
			expect(shown.sort()).toEqual(documented.sort());
			expect(await page.getByTestId('openapi-link').getAttribute('href')).toBe(
				`${base}/api/v1/openapi.json`
			);
			// The article never makes the page scroll sideways (code scrolls inside its box).
			const overflow = await page.locator('article').evaluate((a) => a.scrollWidth - a.clientWidth);
			expect(overflow).toBeLessThanOrEqual(0);
			await page.screenshot({ path: `test-results/api-reference-${width}.png` });
			await page.screenshot({
				path: `test-results/api-reference-${width}-full.png`,
				fullPage: true
			});
			await context.close();
		});
	}
});
