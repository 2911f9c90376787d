import type { ApiOperation, ExampleValue } from './operations';

/*
 * Code samples of each operation's example request, for the OpenAPI document
 * (`x-codeSamples`, which reference renderers show) and the reference page: curl, Python with
 * requests (and pandas for lists), R with httr2 and jsonlite. Tokens are read from the
 * environment variable HOPLINE_TOKEN, never written into a sample.
 */

export interface CodeSample {
	lang: 'Shell' | 'Python' | 'R';
	label: 'curl' | 'Python' | 'R';
	source: string;
}

const TOKEN_VARIABLE = 'HOPLINE_TOKEN';

interface SampleRequest {
	method: 'GET' | 'POST' | 'DELETE';
	url: string;
	query: [string, ExampleValue][];
	body: ApiOperation['body'];
	needsToken: boolean;
	/** A JSON page of rows (items), which pandas and R turn into a table. */
	isList: boolean;
	/** The answer is CSV, read as a table. */
	isCsv: boolean;
}

function requestOf(op: ApiOperation, apiBase: string): SampleRequest {
	const example = op.example ?? {};
	const pathNames = new Set(Object.keys(op.pathParams ?? {}));
	const path = op.path.replace(/\{(\w+)\}/g, (_, name: string) => {
		const value = example[name] ?? op.pathParams?.[name]?.example;
		if (value === undefined) throw new Error(`${op.operationId}: no example for {${name}}`);
		return encodeURIComponent(String(value));
	});
	return {
		method: op.method === 'get' ? 'GET' : op.method === 'post' ? 'POST' : 'DELETE',
		url: apiBase + (path === '/' ? '' : path),
		query: Object.entries(example).filter(([name]) => !pathNames.has(name)),
		body: op.body,
		needsToken: op.access === 'contributor',
		isList: op.success.schema?.endsWith('Page') ?? false,
		isCsv: op.success.csvOnly !== undefined
	};
}

/** The file parts of a multipart body and their types (a CSV `file` unless the body says). */
function fileTypes(body: NonNullable<ApiOperation['body']>): Record<string, string> {
	if (body.mediaType !== 'multipart/form-data') return {};
	return Object.fromEntries(
		Object.entries(body.encoding ?? { file: { contentType: 'text/csv' } }).map(([k, v]) => [
			k,
			v.contentType
		])
	);
}

const queryValue = (v: ExampleValue) => (Array.isArray(v) ? v.join(',') : String(v));

function urlWithQuery(r: SampleRequest): string {
	if (r.query.length === 0) return r.url;
	const params = new URLSearchParams(r.query.map(([k, v]) => [k, queryValue(v)]));
	return `${r.url}?${params.toString().replaceAll('%2C', ',')}`;
}

/** A string in single quotes for a POSIX shell. */
const shellQuote = (s: string) => `'${s.replaceAll("'", `'\\''`)}'`;

function curl(r: SampleRequest): string {
	const lines = [
		`curl -sS${r.method === 'GET' ? '' : ` -X ${r.method}`} ${shellQuote(urlWithQuery(r))}`
	];
	if (r.needsToken) lines.push(`-H "Authorization: Bearer $${TOKEN_VARIABLE}"`);
	if (r.body?.mediaType === 'application/json') {
		lines.push(`-H 'Content-Type: application/json'`);
		lines.push(`--data ${shellQuote(JSON.stringify(r.body.example, null, 2))}`);
	} else if (r.body) {
		const files = fileTypes(r.body);
		for (const [name, value] of Object.entries(r.body.example as Record<string, string>)) {
			const type = files[name];
			lines.push(`-F ${shellQuote(type ? `${name}=@${value};type=${type}` : `${name}=${value}`)}`);
		}
	}
	return lines.join(' \\\n  ');
}

/** A Python literal of JSON-like data, indented by `indent` levels of four spaces. */
export function pythonLiteral(value: unknown, indent = 0): string {
	const pad = (n: number) => '    '.repeat(n);
	if (value === null || value === undefined) return 'None';
	if (typeof value === 'boolean') return value ? 'True' : 'False';
	if (typeof value === 'number') return String(value);
	if (typeof value === 'string') return JSON.stringify(value);
	const oneLine = (items: string[], open: string, close: string) =>
		`${open}${items.join(', ')}${close}`;
	const lines = (items: string[], open: string, close: string) =>
		`${open}\n${items.map((i) => `${pad(indent + 1)}${i},`).join('\n')}\n${pad(indent)}${close}`;
	const shape = (items: string[], open: string, close: string) => {
		const short = oneLine(items, open, close);
		return short.length + indent * 4 <= 72 && !short.includes('\n')
			? short
			: lines(items, open, close);
	};
	if (Array.isArray(value))
		return shape(
			value.map((v) => pythonLiteral(v, indent + 1)),
			'[',
			']'
		);
	const entries = Object.entries(value as Record<string, unknown>).map(
		([k, v]) => `${JSON.stringify(k)}: ${pythonLiteral(v, indent + 1)}`
	);
	return shape(entries, '{', '}');
}

function python(r: SampleRequest): string {
	const imports = ['import requests'];
	if (r.needsToken) imports.unshift('import os');
	if (r.isList || r.isCsv) imports.push('import pandas as pd');
	if (r.isCsv) imports.unshift('import io');
	const args = [JSON.stringify(r.url)];
	if (r.query.length) {
		const params = Object.fromEntries(r.query.map(([k, v]) => [k, Array.isArray(v) ? [...v] : v]));
		args.push(`params=${pythonLiteral(params, 1)}`);
	}
	if (r.needsToken)
		args.push(`headers={"Authorization": f"Bearer {os.environ['${TOKEN_VARIABLE}']}"}`);
	const multipart = r.body?.mediaType === 'multipart/form-data';
	const types = r.body ? fileTypes(r.body) : {};
	const example = multipart ? (r.body?.example as Record<string, string>) : {};
	const fields = Object.fromEntries(Object.entries(example).filter(([k]) => !types[k]));
	const files = Object.entries(example).filter(([k]) => types[k]);
	if (r.body?.mediaType === 'application/json')
		args.push(`json=${pythonLiteral(r.body.example, 1)}`);
	if (multipart) {
		args.push(`data=${pythonLiteral(fields, 1)}`);
		const parts = files.map(
			([k, v], i) =>
				`${JSON.stringify(k)}: (${JSON.stringify(v)}, f${i}, ${JSON.stringify(types[k])})`
		);
		args.push(`files={${parts.join(', ')}}`);
	}
	args.push('timeout=60');
	const call = [`r = requests.${r.method.toLowerCase()}(`, ...args.map((a) => `    ${a},`), ')'];
	const lines = [...imports, ''];
	if (multipart) {
		const opens = files.map(([, v], i) => `open(${JSON.stringify(v)}, "rb") as f${i}`);
		lines.push(`with ${opens.join(', ')}:`);
		lines.push(
			...call
				.join('\n')
				.split('\n')
				.map((l) => `    ${l}`)
		);
	} else {
		lines.push(...call);
	}
	lines.push('r.raise_for_status()');
	if (r.isCsv) {
		lines.push('df = pd.read_csv(io.StringIO(r.text))');
		lines.push('print(r.headers["X-Total-Count"], "rows;", len(df), "read")');
	} else if (r.isList) {
		lines.push('page = r.json()');
		lines.push('# one row per item; nested fields become columns such as centre.label');
		lines.push('df = pd.json_normalize(page["items"])');
		lines.push(
			'print(page["total"], "rows match;", len(df), "in this page; next:", page["links"]["next"])'
		);
	} else if (r.method === 'DELETE') {
		lines.push('print(r.status_code)');
	} else {
		lines.push('print(r.json())');
	}
	return lines.join('\n');
}

/** A string in R's single quotes. */
const rQuote = (s: string) => `'${s.replaceAll('\\', '\\\\').replaceAll("'", "\\'")}'`;

function r(r: SampleRequest): string {
	const lines = ['library(httr2)', '', `resp <- request(${rQuote(r.url)}) |>`];
	if (r.query.length) {
		const args = r.query.map(([k, v]) =>
			typeof v === 'number' ? `${k} = ${v}` : `${k} = ${rQuote(queryValue(v))}`
		);
		lines.push(`  req_url_query(${args.join(', ')}) |>`);
	}
	if (r.needsToken) lines.push(`  req_auth_bearer_token(Sys.getenv("${TOKEN_VARIABLE}")) |>`);
	if (r.method === 'DELETE') lines.push('  req_method("DELETE") |>');
	if (r.body?.mediaType === 'application/json') {
		lines.push(
			`  req_body_raw(${rQuote(JSON.stringify(r.body.example, null, 2))}, type = "application/json") |>`
		);
	} else if (r.body) {
		const types = fileTypes(r.body);
		const parts = Object.entries(r.body.example as Record<string, string>).map(([k, v]) =>
			types[k]
				? `${k} = curl::form_file(${rQuote(v)}, type = ${rQuote(types[k])})`
				: `${k} = ${rQuote(v)}`
		);
		lines.push(`  req_body_multipart(${parts.join(', ')}) |>`);
	}
	lines.push('  req_perform()');
	if (r.isCsv) {
		lines.push('rows <- read.csv(text = resp_body_string(resp))');
		lines.push('cat(resp_header(resp, "X-Total-Count"), "rows;", NROW(rows), "read\\n")');
	} else if (r.isList) {
		lines.push(
			'# a data frame, one row per item; nested fields flattened into columns such as centre.label'
		);
		lines.push('page <- jsonlite::fromJSON(resp_body_string(resp), flatten = TRUE)');
		lines.push('items <- page$items');
		lines.push('cat(page$total, "rows match;", NROW(items), "in this page\\n")');
	} else if (r.method === 'DELETE') {
		lines.push('print(resp_status(resp))');
	} else {
		lines.push('answer <- jsonlite::fromJSON(resp_body_string(resp))');
		lines.push('str(answer)');
	}
	return lines.join('\n');
}

/** curl, Python and R for the operation's example request against `apiBase` (…/api/v1). */
export function codeSamples(op: ApiOperation, apiBase: string): CodeSample[] {
	const request = requestOf(op, apiBase);
	return [
		{ lang: 'Shell', label: 'curl', source: curl(request) },
		{ lang: 'Python', label: 'Python', source: python(request) },
		{ lang: 'R', label: 'R', source: r(request) }
	];
}
