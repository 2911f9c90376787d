import { createHash } from 'node:crypto';
import { ENTRY_KINDS, KINDS, type EntryKind } from '$lib/kinds';
import { publicFieldName } from '$lib/kinds/publicNames';
import { LIST_KEYS } from '$lib/schemas/catalogueQuery';
import { config } from '../config';
import { codeSamples } from './codeSamples';
import { ERROR_EXAMPLES } from './examples';
import { componentSchemas, requestSchema, storedSchema, type JsonSchema } from './jsonSchema';
import {
	OPERATIONS,
	PARAMETER_TEXT,
	RESPONSE_SCHEMAS,
	TAGS,
	type ApiOperation,
	type Tag
} from './operations';
import type {
	OpenApiDocument,
	OpenApiMedia,
	OpenApiOperation,
	OpenApiParameter,
	OpenApiResponse,
	SecurityRequirement
} from './types';

/*
 * The OpenAPI 3.1 document of /api/v1, built from the table of operations (operations.ts) and
 * the zod schemas it names, once per server process (it depends only on the code and on
 * ORIGIN), and served as the same bytes with the same ETag until the process ends.
 */

export const API_PREFIX = '/api/v1';
export const DOCUMENT_PATH = `${API_PREFIX}/openapi.json`;
export const REFERENCE_PAGE = '/api';

const DESCRIPTION = [
	'Everything the search page shows comes from this API, so anything you can find by hand you can fetch from a script, a notebook or another site’s page. Answers are JSON; the lists also come as CSV with `format=csv`.',
	'Lists answer a page of `limit` rows (1–500, default 100) with `total` and `nextCursor`: pass `nextCursor` back as `cursor` unchanged, or follow `links.next` (with CSV, the `Link` header). List filters with several values repeat the parameter or separate values with commas: `kind=fe4s4&kind=heme_c` or `kind=fe4s4,heme_c`. Unknown parameters are errors, so a typo never widens a query silently.',
	'Units: potentials in mV vs SHE (the value and reference electrode as reported are kept beside it), temperatures in K, distances in Å, energies in eV unless a field names another unit. Numbers in query parameters are plain decimals: a typeset minus sign (−0.1) and a decimal comma (0,7) are read; hexadecimal (`0x10`), `Infinity` and values beyond the range of a double (`1e400`) are not numbers, and an empty value counts as absent (a required parameter is then missing). Each parameter’s range is in its schema (`minimum`, `maximum`).',
	'Reading public data and using the calculators needs no account. A personal API token, made on /account and sent as `Authorization: Bearer <token>`, adds the entries of your groups to every read; with the scope read+submit it also opens the contributor endpoints. Browsers on other sites may read the API without credentials (CORS).',
	'Every error has one shape, `{ "error": { "code", "message", "fields"? } }`: `code` comes from a closed list and fixes the HTTP status; `fields` names each bad parameter or body field and what was expected. 503 and 429 carry `Retry-After` (seconds).'
].join('\n\n');

/** Names of the error answers under components/responses, by status. */
const ERROR_RESPONSES: Record<number, { name: string; description: string; retryAfter?: true }> = {
	400: {
		name: 'BadRequest',
		description: 'A parameter or body field is not what was expected; `fields` names each.'
	},
	401: {
		name: 'Unauthorized',
		description:
			'Sign-in or a token is needed (contributor endpoints), or the token sent is wrong, expired or revoked (any endpoint).'
	},
	403: {
		name: 'Forbidden',
		description:
			'The account’s role or the token’s scope does not allow this, or a cookie-authenticated write came from another site.'
	},
	404: { name: 'NotFound', description: 'No such entry, version or submission visible to you.' },
	409: {
		name: 'Conflict',
		description:
			'The state of things refuses it (too many rows awaiting review, a submission no longer open).'
	},
	413: {
		name: 'PayloadTooLarge',
		description: 'The body or file is larger than the server accepts.'
	},
	415: {
		name: 'UnsupportedMediaType',
		description:
			'The file is of a type the registry does not accept, read from its bytes (SVG, HTML, scripts, archives, polyglots).'
	},
	422: {
		name: 'UnprocessableContent',
		description:
			'The calculation ran past its time limit and was stopped, or a file of an accepted type cannot be read (a damaged image, a numbers file that cannot be plotted).'
	},
	429: {
		name: 'TooManyRequests',
		description:
			'Too many requests: calculations from one address without an account, or a token past its rate limit (with `RateLimit-*` headers). Wait `Retry-After` seconds.',
		retryAfter: true
	},
	500: {
		name: 'InternalError',
		description: 'A fault on the server, logged with the `errorId` the answer carries.'
	},
	503: {
		name: 'Unavailable',
		description:
			'Every calculation worker is busy and the queue is full. Wait `Retry-After` seconds.',
		retryAfter: true
	}
};

/** Statuses every operation may answer. */
const ALWAYS = [401, 429, 500] as const;

/** The schema component of an entry kind's stored data: `spin_record` → `SpinRecordData`. */
export function dataSchemaName(kind: EntryKind): string {
	return `${kind.replace(/(^|_)([a-z])/g, (_, __, c: string) => c.toUpperCase())}Data`;
}

/** An object schema with its properties (and required list) under their public names. */
function withPublicNames(schema: JsonSchema): JsonSchema {
	const properties = schema.properties as Record<string, JsonSchema> | undefined;
	if (!properties) return schema;
	return {
		...schema,
		properties: Object.fromEntries(
			Object.entries(properties).map(([name, p]) => [publicFieldName(name), p])
		),
		...(Array.isArray(schema.required)
			? { required: (schema.required as string[]).map(publicFieldName) }
			: {})
	};
}

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });

function components(): OpenApiDocument['components'] {
	const schemas: Record<string, JsonSchema> = componentSchemas(RESPONSE_SCHEMAS);
	// An entry's data is in its kind's stored schema: one component per kind, tied to `kind`.
	// Read as a stored version is read back: a field added to a kind later, with a default, may
	// be missing from versions approved before. Fields go out under their public names
	// (kinds/publicNames.ts), as the routes send them.
	for (const kind of ENTRY_KINDS) {
		schemas[dataSchemaName(kind)] = {
			description: `What a version of a ${KINDS[kind].label.toLowerCase()} stores.`,
			...withPublicNames(storedSchema(KINDS[kind].schema))
		};
	}
	schemas.Entry = {
		...schemas.Entry,
		allOf: ENTRY_KINDS.map((kind) => ({
			if: { properties: { kind: { const: kind } }, required: ['kind'] },
			then: { properties: { data: ref(dataSchemaName(kind)) } }
		}))
	};
	const responses: Record<string, OpenApiResponse> = {};
	for (const [status, { name, description, retryAfter }] of Object.entries(ERROR_RESPONSES)) {
		responses[name] = {
			description,
			...(retryAfter
				? {
						headers: {
							'Retry-After': {
								description: 'Seconds to wait before trying again.',
								schema: { type: 'integer', minimum: 0 }
							}
						}
					}
				: {}),
			content: {
				'application/json': { schema: ref('ApiError'), example: ERROR_EXAMPLES[Number(status)] }
			}
		};
	}
	return {
		schemas,
		responses,
		securitySchemes: {
			bearerToken: {
				type: 'http',
				scheme: 'bearer',
				description:
					'A personal API token, made on /account (shown once, stored only as a hash, revocable, with an optional expiry). Scope `read`: reads see what the token owner’s groups see. Scope `read+submit`: also the contributor endpoints, if the owner is a contributor. No cookie or Origin header is needed.'
			},
			sessionCookie: {
				type: 'apiKey',
				in: 'cookie',
				name: 'authjs.session-token',
				description:
					'The site’s sign-in session, for pages of the site itself (named `__Secure-authjs.session-token` over https). Writes with it must come from the site’s own origin.'
			}
		}
	};
}

/** Anyone may call; a token or a session widens what reads see. */
const ANYONE: SecurityRequirement[] = [{}, { bearerToken: ['read'] }, { sessionCookie: [] }];
const CONTRIBUTOR: SecurityRequirement[] = [
	{ bearerToken: ['read+submit'] },
	{ sessionCookie: [] }
];

function parameters(op: ApiOperation): OpenApiParameter[] {
	const list: OpenApiParameter[] = [];
	for (const [name, p] of Object.entries(op.pathParams ?? {})) {
		list.push({
			name,
			in: 'path',
			required: true,
			description: p.description,
			schema: requestSchema(p.schema),
			example: op.example?.[name] ?? p.example
		});
	}
	if (!op.query) return list;
	const query = requestSchema(op.query) as {
		properties: Record<string, JsonSchema>;
		required?: string[];
	};
	for (const [name, schema] of Object.entries(query.properties)) {
		const text = op.parameterText?.[name] ?? PARAMETER_TEXT[name];
		if (!text) throw new Error(`${op.operationId}: no description of the parameter ${name}`);
		const isList = schema.type === 'array' && (LIST_KEYS as readonly string[]).includes(name);
		const example = op.example?.[name];
		list.push({
			name,
			in: 'query',
			required: query.required?.includes(name) ?? false,
			description: isList ? `${text} Repeat the parameter or separate values with commas.` : text,
			...(isList ? { style: 'form' as const, explode: true } : {}),
			schema,
			...(example === undefined ? {} : { example })
		});
	}
	return list;
}

function successResponse(op: ApiOperation): OpenApiResponse {
	const { success } = op;
	if (success.status === 204) return { description: success.description };
	const example = typeof success.example === 'function' ? success.example() : success.example;
	if (success.csvOnly)
		return {
			description: success.description,
			content: { 'text/csv': { schema: { type: 'string', description: success.csvOnly } } },
			...(success.headers
				? {
						headers: Object.fromEntries(
							Object.entries(success.headers).map(([name, description]) => [
								name,
								{ description, schema: { type: 'string' } }
							])
						)
					}
				: {})
		};
	const content: Record<string, OpenApiMedia> = {
		'application/json': {
			schema: success.schema
				? ref(success.schema)
				: { type: 'object', description: 'See the description.' },
			...(example === undefined ? {} : { example })
		}
	};
	if (success.csv) content['text/csv'] = { schema: { type: 'string', description: success.csv } };
	const headers = Object.fromEntries(
		Object.entries(success.headers ?? {}).map(([name, description]) => [
			name,
			{ description, schema: { type: name === 'X-Total-Count' ? 'integer' : 'string' } }
		])
	);
	return {
		description: success.description,
		...(Object.keys(headers).length ? { headers } : {}),
		content
	};
}

function operation(op: ApiOperation, apiBase: string): OpenApiOperation {
	const responses: OpenApiOperation['responses'] = {
		[op.success.status]: successResponse(op)
	};
	if (op.success.notModified) responses['304'] = { description: op.success.notModified };
	for (const status of [...op.errors, ...ALWAYS].sort((a, b) => a - b)) {
		responses[status] = { $ref: `#/components/responses/${ERROR_RESPONSES[status]?.name}` };
	}
	const body = op.body;
	return {
		operationId: op.operationId,
		tags: [op.tag],
		summary: op.summary,
		description: op.description,
		security: op.access === 'contributor' ? CONTRIBUTOR : ANYONE,
		...(op.pathParams || op.query ? { parameters: parameters(op) } : {}),
		...(body
			? {
					requestBody: {
						required: true,
						description: body.description,
						content: {
							[body.mediaType]: {
								schema: requestSchema(body.schema),
								...(body.mediaType === 'multipart/form-data'
									? { encoding: body.encoding ?? { file: { contentType: 'text/csv' } } }
									: { example: body.example })
							}
						}
					}
				}
			: {}),
		responses,
		'x-codeSamples': codeSamples(op, apiBase)
	};
}

/** The document for a site at `origin` (its ORIGIN). */
export function buildOpenApiDocument(origin: string): OpenApiDocument {
	const apiBase = `${origin}${API_PREFIX}`;
	const paths: OpenApiDocument['paths'] = {};
	for (const op of OPERATIONS) {
		const item = (paths[op.path] ??= {});
		if (item[op.method]) throw new Error(`${op.method} ${op.path} is described twice`);
		item[op.method] = operation(op, apiBase);
	}
	return {
		openapi: '3.1.0',
		jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
		info: {
			title: 'Hopline API',
			version: '1.0',
			summary:
				'A curated registry of biological redox centres: midpoint potentials, spin states, distances, and electron-transfer calculators.',
			description: DESCRIPTION
		},
		servers: [{ url: apiBase, description: 'This site' }],
		externalDocs: {
			url: `${origin}${REFERENCE_PAGE}`,
			description: 'The reference page, with examples'
		},
		tags: (Object.entries(TAGS) as [Tag, string][]).map(([name, description]) => ({
			name,
			description
		})),
		security: ANYONE,
		paths,
		components: components()
	};
}

export interface ServedDocument {
	document: OpenApiDocument;
	/** The bytes served at /api/v1/openapi.json. */
	json: string;
	/** A strong ETag of those bytes. */
	etag: string;
}

// Built on first use and kept for the life of the process: it depends only on the code and on
// ORIGIN, so every reader gets the same bytes (the same for everyone, never per user).
let served: ServedDocument | undefined;

/** The document of this site, built once per process. */
export function openApiDocument(): ServedDocument {
	if (!served) {
		const document = buildOpenApiDocument(new URL(config.ORIGIN).origin);
		const json = JSON.stringify(document);
		const etag = `"${createHash('sha256').update(json).digest('base64url')}"`;
		served = { document, json, etag };
	}
	return served;
}
