import { DOI_PATTERN } from '$lib/schemas/source';
import { cslItemSchema, metadataFromCsl, type DoiMetadata } from './cslJson';

/*
 * Looks up a DOI's metadata from a DOI metadata service by content negotiation
 * (GET {base}/{doi}, Accept: CSL-JSON — as doi.org answers). Every failure comes back as a
 * reason and a message a contributor can act on; none throws.
 */
export type DoiLookup =
	| { ok: true; metadata: DoiMetadata }
	| {
			ok: false;
			reason: 'malformed' | 'not_found' | 'timeout' | 'unavailable' | 'bad_response';
			message: string;
	  };

export interface DoiClientOptions {
	baseUrl: string;
	timeoutMs: number;
	fetch?: typeof fetch;
}

/** A DOI as people paste it: bare, with a doi: prefix, or as a doi.org link. */
export function normaliseDoi(input: string): string {
	return input
		.trim()
		.replace(/^https?:\/\/(dx\.)?doi\.org\//i, '')
		.replace(/^doi:\s*/i, '');
}

export async function lookupDoi(input: string, options: DoiClientOptions): Promise<DoiLookup> {
	const doi = normaliseDoi(input);
	if (!DOI_PATTERN.test(doi)) {
		return {
			ok: false,
			reason: 'malformed',
			message: `"${input}" is not a DOI; expected one such as 10.5555/12345678`
		};
	}
	const url = `${options.baseUrl.replace(/\/$/, '')}/${doi.split('/').map(encodeURIComponent).join('/')}`;
	let response: Response;
	try {
		response = await (options.fetch ?? fetch)(url, {
			headers: { accept: 'application/vnd.citationstyles.csl+json' },
			signal: AbortSignal.timeout(options.timeoutMs)
		});
	} catch (e) {
		if (e instanceof DOMException && (e.name === 'TimeoutError' || e.name === 'AbortError')) {
			return {
				ok: false,
				reason: 'timeout',
				message: `the DOI service did not answer within ${options.timeoutMs / 1000} s; fill in the fields by hand or try again later`
			};
		}
		return {
			ok: false,
			reason: 'unavailable',
			message: 'the DOI service cannot be reached; fill in the fields by hand or try again later'
		};
	}
	if (response.status === 404) {
		await response.body?.cancel();
		return { ok: false, reason: 'not_found', message: `no record for DOI ${doi}` };
	}
	if (!response.ok) {
		await response.body?.cancel();
		return {
			ok: false,
			reason: 'unavailable',
			message: `the DOI service answered ${response.status}; fill in the fields by hand or try again later`
		};
	}
	let body: unknown;
	try {
		body = await response.json();
	} catch {
		body = null;
	}
	const item = cslItemSchema.safeParse(body);
	if (!item.success || !item.data.title) {
		return {
			ok: false,
			reason: 'bad_response',
			message: 'the DOI service sent metadata we cannot read; fill in the fields by hand'
		};
	}
	return { ok: true, metadata: metadataFromCsl(doi, item.data) };
}
