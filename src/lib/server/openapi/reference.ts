import type { CodeSample } from './codeSamples';
import type { JsonSchema } from './jsonSchema';
import type { ApiIndex } from './operations';
import type {
	HttpMethod,
	OpenApiDocument,
	OpenApiOperation,
	OpenApiResponse,
	SecurityRequirement
} from './types';

/*
 * Readings of the OpenAPI document for people and explorers: the /api reference page and the
 * /api/v1 index are made from the document itself (never from the table behind it), so they
 * show exactly what the document says.
 */

type Document = OpenApiDocument;
type Operation = OpenApiOperation;

type Upper = 'GET' | 'POST' | 'DELETE';
const UPPER: Record<HttpMethod, Upper> = { get: 'GET', post: 'POST', delete: 'DELETE' };
const METHODS: readonly HttpMethod[] = ['get', 'post', 'delete'];

/** The operations of the document in its order, with their full paths. */
function operations(doc: Document): { method: Upper; path: string; op: Operation }[] {
	const base = new URL(doc.servers[0]?.url ?? 'http://localhost/api/v1').pathname;
	const list: { method: Upper; path: string; op: Operation }[] = [];
	for (const [path, item] of Object.entries(doc.paths)) {
		for (const method of METHODS) {
			const op = item[method];
			if (op) {
				const upper = UPPER[method];
				list.push({ method: upper, path: base + (path === '/' ? '' : path), op });
			}
		}
	}
	return list;
}

const SAFE = Number.MAX_SAFE_INTEGER;
const num = (n: number) => String(n).replace('-', '−');

/** A schema in words: "number from −2000 to 2000", "list of one of: fe4s4, heme_c". */
export function schemaText(schema: JsonSchema | undefined): string {
	if (!schema) return 'any';
	const s = schema as {
		$ref?: string;
		anyOf?: JsonSchema[];
		oneOf?: JsonSchema[];
		const?: unknown;
		enum?: unknown[];
		type?: string | string[];
		items?: JsonSchema;
		minItems?: number;
		maxItems?: number;
		minimum?: number;
		maximum?: number;
		exclusiveMinimum?: number;
		maxLength?: number;
		pattern?: string;
		format?: string;
		properties?: Record<string, JsonSchema>;
	};
	if (s.$ref) return s.$ref.split('/').at(-1) ?? 'object';
	const alternatives = s.anyOf ?? s.oneOf;
	if (alternatives) return alternatives.map(schemaText).join(' or ');
	if (s.const !== undefined) return JSON.stringify(s.const);
	if (s.enum) return `one of: ${s.enum.map(String).join(', ')}`;
	const type = Array.isArray(s.type) ? s.type : [s.type];
	if (type.length > 1) return type.map((t) => schemaText({ ...schema, type: t })).join(' or ');
	switch (type[0]) {
		case 'array': {
			const bounds =
				s.maxItems !== undefined
					? ` (${s.minItems ? `${s.minItems} to ` : 'up to '}${s.maxItems})`
					: s.minItems
						? ` (at least ${s.minItems})`
						: '';
			return `list${bounds} of ${schemaText(s.items)}`;
		}
		case 'number':
		case 'integer': {
			const kind = type[0] === 'integer' ? 'whole number' : 'number';
			const low = s.minimum !== undefined && s.minimum > -SAFE ? s.minimum : undefined;
			const high = s.maximum !== undefined && s.maximum < SAFE ? s.maximum : undefined;
			if (s.exclusiveMinimum !== undefined) return `${kind} above ${num(s.exclusiveMinimum)}`;
			if (low !== undefined && high !== undefined)
				return `${kind} from ${num(low)} to ${num(high)}`;
			if (low !== undefined) return `${kind}, at least ${num(low)}`;
			if (high !== undefined) return `${kind}, at most ${num(high)}`;
			return kind;
		}
		case 'string':
			if (s.format === 'binary') return 'file';
			if (s.pattern) return `text matching ${s.pattern}`;
			return s.maxLength !== undefined ? `text (at most ${s.maxLength} characters)` : 'text';
		case 'boolean':
			return 'true or false';
		case 'null':
			return 'null';
		case 'object': {
			const names = Object.entries(s.properties ?? {}).map(([k, v]) =>
				(v as { const?: unknown }).const !== undefined ? `${k} ${JSON.stringify(v.const)}` : k
			);
			return names.length ? `object (${names.join(', ')})` : 'object';
		}
		default:
			return 'any';
	}
}

export interface ReferenceField {
	name: string;
	where: 'path' | 'query' | 'body';
	required: boolean;
	type: string;
	defaultValue: string | null;
	description: string;
	example: string | null;
}

export interface ReferenceOperation {
	id: string;
	method: string;
	path: string;
	summary: string;
	description: string;
	access: string;
	fields: ReferenceField[];
	body: { mediaType: string; description: string; example: string | null } | null;
	responses: { status: string; description: string; mediaTypes: string[] }[];
	answerExample: string | null;
	samples: CodeSample[];
}

export interface ApiReference {
	title: string;
	summary: string;
	paragraphs: string[];
	documentUrl: string;
	apiBase: string;
	security: { name: string; description: string }[];
	tags: { name: string; description: string; operations: ReferenceOperation[] }[];
}

const example = (v: unknown) =>
	v === undefined ? null : Array.isArray(v) ? v.join(',') : String(v);

function bodyFields(schema: JsonSchema): ReferenceField[] {
	const variants = (schema.oneOf as JsonSchema[] | undefined) ?? [schema];
	const first = variants[0] as { properties?: Record<string, JsonSchema>; required?: string[] };
	return Object.entries(first.properties ?? {}).map(([name, property]) => {
		const forms = variants.map((v) => (v.properties as Record<string, JsonSchema>)[name]);
		const consts = forms.map((f) => f?.const);
		const type = consts.every((c) => c !== undefined)
			? `one of: ${consts.map(String).join(', ')}`
			: variants.length > 1 && new Set(forms.map((f) => JSON.stringify(f))).size > 1
				? 'object, its fields depending on kind'
				: schemaText(property);
		const p = property as { description?: string; default?: unknown };
		return {
			name,
			where: 'body',
			required: first.required?.includes(name) ?? false,
			type,
			defaultValue: p.default === undefined ? null : JSON.stringify(p.default),
			description: p.description ?? '',
			example: null
		};
	});
}

function accessText(security: SecurityRequirement[]): string {
	const open = security.some((s) => Object.keys(s).length === 0);
	const scopes = security.flatMap((s) => s.bearerToken ?? []);
	return open
		? `No account needed; a token (scope ${scopes.join(', ')}) or a signed-in session adds your groups’ entries.`
		: `Contributors only: a token with scope ${scopes.join(', ')}, or a signed-in session.`;
}

function response(doc: Document, r: Operation['responses'][string]): OpenApiResponse | undefined {
	return '$ref' in r ? doc.components.responses[r.$ref.split('/').at(-1) ?? ''] : r;
}

function referenceOperation(
	doc: Document,
	method: string,
	path: string,
	op: Operation
): ReferenceOperation {
	const fields: ReferenceField[] = (op.parameters ?? []).map((p) => ({
		name: p.name,
		where: p.in,
		required: p.required,
		type: schemaText(p.schema),
		defaultValue: p.schema.default === undefined ? null : JSON.stringify(p.schema.default),
		description: p.description,
		example: example(p.example)
	}));
	const request = op.requestBody;
	const [mediaType, media] = Object.entries(request?.content ?? {})[0] ?? [];
	if (media) fields.push(...bodyFields(media.schema));
	const responses = Object.entries(op.responses).map(([status, r]) => {
		const answer = response(doc, r);
		return {
			status,
			description: answer?.description ?? '',
			mediaTypes: Object.keys(answer?.content ?? {})
		};
	});
	const success = Object.entries(op.responses).find(([status]) => status.startsWith('2'))?.[1];
	const answer = success && response(doc, success)?.content?.['application/json']?.example;
	return {
		id: op.operationId,
		method,
		path,
		summary: op.summary,
		description: op.description,
		access: accessText(op.security),
		fields,
		body:
			request && mediaType
				? {
						mediaType,
						description: request.description,
						example: media?.example === undefined ? null : JSON.stringify(media.example, null, 2)
					}
				: null,
		responses,
		answerExample: answer === undefined ? null : JSON.stringify(answer, null, 2),
		samples: op['x-codeSamples']
	};
}

/** The reference page's content, read from the document. */
export function apiReference(doc: Document): ApiReference {
	const all = operations(doc).map(({ method, path, op }) => ({
		tag: op.tags?.[0] ?? '',
		operation: referenceOperation(doc, method, path, op)
	}));
	const apiBase = doc.servers[0]?.url ?? '';
	return {
		title: doc.info.title,
		summary: doc.info.summary,
		paragraphs: doc.info.description.split(/\n\n+/),
		documentUrl: `${apiBase}/openapi.json`,
		apiBase,
		security: Object.entries(doc.components.securitySchemes).map(([name, s]) => ({
			name,
			description: s.description
		})),
		tags: doc.tags.map((t) => ({
			name: t.name,
			description: t.description,
			operations: all.filter((o) => o.tag === t.name).map((o) => o.operation)
		}))
	};
}

/** What GET /api/v1 answers: the operations of the document and where the document is. */
export function apiIndex(doc: Document): ApiIndex {
	const apiBase = doc.servers[0]?.url ?? '';
	const error = doc.components.schemas.ApiError as
		{ properties: { error: { properties: { code: { enum: string[] } } } } } | undefined;
	return {
		name: doc.info.title,
		version: doc.info.version,
		description: doc.info.summary,
		openapi: `${apiBase}/openapi.json`,
		reference: doc.externalDocs.url,
		endpoints: operations(doc).map(({ method, path, op }) => ({
			method,
			path,
			summary: op.summary,
			parameters: (op.parameters ?? []).filter((p) => p.in === 'query').map((p) => p.name)
		})),
		errors: {
			shape: '{ "error": { "code", "message", "fields"? } }',
			codes: error?.properties.error.properties.code.enum ?? []
		}
	};
}
