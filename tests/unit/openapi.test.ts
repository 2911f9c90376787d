import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, sep } from 'node:path';
import SwaggerParser from '@apidevtools/swagger-parser';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument, openApiDocument } from '$lib/server/openapi/document';
import { EXAMPLES } from '$lib/server/openapi/examples';
import { OPERATIONS } from '$lib/server/openapi/operations';
import { apiIndex, apiReference } from '$lib/server/openapi/reference';
import type { OpenApiOperation, OpenApiResponse } from '$lib/server/openapi/types';
import { documentValidator } from '../support/openapiValidator';

const ORIGIN = 'http://127.0.0.1:3204';
const doc = buildOpenApiDocument(ORIGIN);
const validator = documentValidator(doc);

/** A fresh copy as JSON would give it (the validator dereferences in place). */
const copy = () => JSON.parse(JSON.stringify(doc));

/**
 * Route files under src/routes/api/v1 and the OpenAPI path each stands for: folders become
 * path segments, `[name=matcher]` becomes `{name}`. The `[...rest]` fallback answers unknown
 * paths with a JSON 404 and is no endpoint.
 */
function routeFiles(): { file: string; path: string; methods: string[] }[] {
	const root = join('src', 'routes', 'api', 'v1');
	const files = readdirSync(root, { recursive: true, encoding: 'utf8' })
		.filter((f) => f.endsWith('+server.ts'))
		.map((f) => join(root, f));
	return files
		.filter((file) => !file.includes('[...'))
		.map((file) => {
			const dir = relative(root, file).split(sep).slice(0, -1);
			const path = '/' + dir.map((s) => s.replace(/^\[(\w+)(=\w+)?\]$/, '{$1}')).join('/');
			const methods = [
				...readFileSync(file, 'utf8').matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)
			].map((m) => (m[1] as string).toLowerCase());
			return { file, path, methods };
		});
}

describe('the OpenAPI document', () => {
	it('is a valid OpenAPI 3.1 document (swagger-parser)', async () => {
		const api = await SwaggerParser.validate(copy());
		expect('openapi' in api && api.openapi).toBe('3.1.0');
		// The validator does refuse a broken document, so the check above can fail.
		const broken = copy();
		broken.paths['/potentials'].get.parameters[0].in = 'body';
		await expect(SwaggerParser.validate(broken)).rejects.toThrow();
	});

	it('has an operation for every route file under src/routes/api/v1, and a route for every operation', () => {
		const routes = routeFiles();
		expect(routes.length).toBeGreaterThanOrEqual(15);
		for (const route of routes) {
			expect(doc.paths[route.path], `${route.file} has no path ${route.path}`).toBeDefined();
			for (const method of route.methods) {
				expect(
					doc.paths[route.path]?.[method as 'get'],
					`${method.toUpperCase()} ${route.path} (${route.file}) is not in the document`
				).toBeDefined();
			}
		}
		for (const [path, item] of Object.entries(doc.paths)) {
			for (const method of Object.keys(item)) {
				const route = routes.find((r) => r.path === path);
				expect(route?.methods, `${method} ${path} has no route`).toContain(method);
			}
		}
	});

	it('states the bounds of the zod schemas the routes validate with', () => {
		const params = doc.paths['/potentials']?.get?.parameters ?? [];
		const emMin = params.find((p) => p.name === 'emMin');
		// queryNumber(-2000, 2000): once a refinement, invisible to JSON Schema.
		expect(emMin?.schema).toMatchObject({ type: 'number', minimum: -2000, maximum: 2000 });
		const limit = params.find((p) => p.name === 'limit');
		expect(limit?.schema).toMatchObject({
			type: 'integer',
			minimum: 1,
			maximum: 500,
			default: 100
		});
		const kind = params.find((p) => p.name === 'kind');
		expect(kind).toMatchObject({ style: 'form', explode: true, schema: { type: 'array' } });
		const distance = doc.paths['/calc/hop-rate']?.get?.parameters?.find(
			(p) => p.name === 'distance'
		);
		expect(distance).toMatchObject({ required: true, schema: { minimum: 3.6, maximum: 100 } });
		expect(distance?.description).toMatch(/van der Waals contact/);
		// Query numbers are read through a preprocessing step (readDecimal); their defaults stay stated.
		const temperature = doc.paths['/calc/hop-rate']?.get?.parameters?.find(
			(p) => p.name === 'temperature'
		);
		expect(temperature?.schema).toMatchObject({ type: 'number', default: 298.15, minimum: 1 });
		expect(doc.info.description).toMatch(/decimal comma/);
	});

	it('describes every parameter, operation and answer', () => {
		for (const [path, item] of Object.entries(doc.paths)) {
			for (const op of Object.values(item) as OpenApiOperation[]) {
				expect(op.summary, path).not.toBe('');
				expect(op.description, path).not.toBe('');
				for (const p of op.parameters ?? [])
					expect(p.description, `${path} ${p.name}`).not.toBe('');
				for (const status of ['401', '429', '500'])
					expect(op.responses[status], `${path} ${status}`).toBeDefined();
			}
		}
	});

	it('has a bearer scheme, required with scope read+submit by the contributor endpoints', () => {
		expect(doc.components.securitySchemes.bearerToken).toMatchObject({
			type: 'http',
			scheme: 'bearer'
		});
		expect(doc.paths['/submissions']?.post?.security).toEqual([
			{ bearerToken: ['read+submit'] },
			{ sessionCookie: [] }
		]);
		expect(doc.paths['/potentials']?.get?.security).toContainEqual({});
	});

	it('holds examples that validate against their own schemas (ajv, draft 2020-12)', () => {
		let checked = 0;
		const check = (schema: unknown, example: unknown, where: string) => {
			const result = validator.validate(schema, example);
			expect(result.errors, where).toEqual([]);
			checked++;
		};
		for (const [path, item] of Object.entries(doc.paths)) {
			for (const [method, op] of Object.entries(item) as [string, OpenApiOperation][]) {
				const where = `${method} ${path}`;
				for (const p of op.parameters ?? [])
					if (p.example !== undefined) {
						// Query values travel as text; lists as repeated values.
						const value =
							p.schema.type === 'number' || p.schema.type === 'integer'
								? Number(p.example)
								: p.example;
						check(p.schema, value, `${where} ${p.name}`);
					}
				for (const media of Object.values(op.requestBody?.content ?? {}))
					if (media.example !== undefined) check(media.schema, media.example, `${where} body`);
				for (const [status, r] of Object.entries(op.responses)) {
					const media = (r as OpenApiResponse).content?.['application/json'];
					if (media?.example !== undefined)
						check(media.schema, media.example, `${where} ${status}`);
				}
			}
		}
		for (const [name, r] of Object.entries(doc.components.responses)) {
			const media = r.content?.['application/json'];
			check(media?.schema, media?.example, name);
		}
		expect(checked).toBeGreaterThan(40);
	});

	it('ties an entry’s data to its kind’s stored schema', () => {
		const entry = { $ref: '#/components/schemas/Entry' };
		expect(validator.validate(entry, EXAMPLES.entry).errors).toEqual([]);
		const wrong = { ...EXAMPLES.entry, data: { ...EXAMPLES.entry.data, emMvShe: 'low' } };
		expect(validator.validate(entry, wrong).errors).not.toEqual([]);
		const asCentre = { ...EXAMPLES.entry, kind: 'centre' };
		expect(validator.validate(entry, asCentre).errors).not.toEqual([]);
	});

	it('refuses answers with fields the schemas do not name', () => {
		const page = { $ref: '#/components/schemas/PotentialPage' };
		const extra = structuredClone(EXAMPLES.potentialPage) as { items: Record<string, unknown>[] };
		(extra.items[0] as Record<string, unknown>).colour = 'red';
		expect(validator.validate(page, extra).errors.join()).toMatch(/additional/);
	});

	it('is built once per process, with a strong ETag of its bytes', () => {
		const first = openApiDocument();
		expect(openApiDocument()).toBe(first);
		expect(first.etag).toMatch(/^"[A-Za-z0-9_-]{43}"$/);
		expect(JSON.parse(first.json)).toEqual(first.document);
		// Built again from the same code and origin, the bytes (and so the ETag) are the same.
		expect(JSON.stringify(buildOpenApiDocument(ORIGIN))).toBe(JSON.stringify(doc));
	});
});

describe('readings of the document', () => {
	it('the /api/v1 index lists every operation with its query parameters', () => {
		const index = apiIndex(doc);
		expect(index.endpoints).toHaveLength(OPERATIONS.length);
		expect(index.openapi).toBe(`${ORIGIN}/api/v1/openapi.json`);
		const potentials = index.endpoints.find((e) => e.path === '/api/v1/potentials');
		expect(potentials?.parameters).toContain('emMin');
		expect(index.errors.codes).toContain('not_found');
		expect(validator.validate({ $ref: '#/components/schemas/ApiIndex' }, index).errors).toEqual([]);
	});

	it('the reference page shows every operation with its parameters and samples', () => {
		const reference = apiReference(doc);
		const ops = reference.tags.flatMap((t) => t.operations);
		expect(ops.map((o) => `${o.method} ${o.path}`).sort()).toEqual(
			apiIndex(doc)
				.endpoints.map((e) => `${e.method} ${e.path}`)
				.sort()
		);
		const hop = ops.find((o) => o.path === '/api/v1/calc/hop-rate');
		expect(hop?.fields.find((f) => f.name === 'distance')).toMatchObject({
			required: true,
			type: 'number from 3.6 to 100'
		});
		const submissions = ops.find((o) => o.path === '/api/v1/submissions');
		expect(submissions?.fields.find((f) => f.name === 'kind')?.type).toBe(
			'one of: protein, centre, potential, spin_record, distance, source'
		);
		for (const op of ops) expect(op.samples.map((s) => s.label)).toEqual(['curl', 'Python', 'R']);
	});
});

describe('code samples', () => {
	const samples = Object.values(doc.paths).flatMap((item) =>
		(Object.values(item) as OpenApiOperation[]).flatMap((op) =>
			op['x-codeSamples'].map((s) => ({ ...s, op: op.operationId }))
		)
	);

	it('are valid shell (bash -n)', () => {
		for (const s of samples.filter((x) => x.label === 'curl')) {
			const run = spawnSync('bash', ['-n'], { input: s.source });
			expect(run.status, `${s.op}: ${run.stderr}`).toBe(0);
		}
	});

	/** Writes the samples in one language to files, and runs `check` on all of them at once. */
	function checkFiles(label: string, extension: string, check: (files: string[]) => void) {
		const dir = mkdtempSync(join(tmpdir(), 'hopline-samples-'));
		try {
			const files = samples
				.filter((x) => x.label === label)
				.map((s) => {
					const file = join(dir, `${s.op}.${extension}`);
					writeFileSync(file, s.source);
					return file;
				});
			expect(files).toHaveLength(OPERATIONS.length);
			check(files);
		} finally {
			rmSync(dir, { recursive: true, force: true });
		}
	}

	it.runIf(spawnSync('python3', ['--version']).status === 0)(
		'are valid Python',
		() =>
			checkFiles('Python', 'py', (files) => {
				const run = spawnSync('python3', ['-m', 'py_compile', ...files]);
				expect(run.status, run.stderr.toString()).toBe(0);
			}),
		30_000
	);

	it.runIf(spawnSync('Rscript', ['--version']).status === 0)(
		'are valid R',
		() =>
			checkFiles('R', 'R', (files) => {
				const run = spawnSync('Rscript', [
					'-e',
					'for (f in commandArgs(TRUE)) invisible(parse(f))',
					...files
				]);
				expect(run.status, run.stderr.toString()).toBe(0);
			}),
		30_000
	);
});
