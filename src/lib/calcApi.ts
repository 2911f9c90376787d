import { readDecimal } from '$lib/schemas/decimal';

/*
 * The "API:" line under each calculator form: the request the documented API takes for the
 * inputs as they stand (typed, or sent), so that a reader can repeat the calculation from a
 * script. Numbers are written as the API's JSON and URLs are best read (a plain decimal point,
 * a hyphen-minus); text that is not a number is passed as typed, for the API to refuse by name.
 */

/** The hop rate API's query parameters, in the order the documentation lists them. */
export const HOP_RATE_API_PARAMS = [
	'distance',
	'dG',
	'lambda',
	'temperature',
	'packing',
	'h0',
	'beta'
] as const;

/** A typed number as the API reads it best: "−0,2" → "-0.2"; not a number: as typed. */
export function apiNumberText(typed: string): string {
	const value = readDecimal(typed);
	return value === null ? typed.trim() : String(value);
}

/** GET /api/v1/calc/hop-rate for the fields as they stand (empty ones left out). */
export function hopRateApiUrl(
	origin: string,
	values: Readonly<Record<string, string | undefined>>,
	model: 'moser-dutton' | 'marcus' = 'moser-dutton'
): string {
	const query = new URLSearchParams();
	for (const name of HOP_RATE_API_PARAMS) {
		const typed = values[name];
		if (typed !== undefined && typed.trim() !== '') query.set(name, apiNumberText(typed));
	}
	query.set('model', model);
	return `${origin}/api/v1/calc/hop-rate?${query}`;
}

/** A shell word: single-quoted, with any single quote inside closed, escaped and reopened. */
const shellQuote = (text: string) => `'${text.replace(/'/g, `'\\''`)}'`;

/** A curl command that POSTs this JSON body to the API path. */
export function curlPost(origin: string, path: string, body: unknown): string {
	return `curl -X POST ${shellQuote(origin + path)} -H 'Content-Type: application/json' -d ${shellQuote(JSON.stringify(body))}`;
}
