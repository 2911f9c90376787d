import type { RequestHandler } from './$types';

/** GET /api/v1 — what the read API offers, for people and for clients exploring it. */
export const GET: RequestHandler = () =>
	Response.json({
		name: 'Hopline read API',
		version: 'v1',
		endpoints: {
			'/api/v1/potentials':
				'midpoint potentials; filters q, kind, organism, method, emMin, emMax (mV vs SHE), phMin, phMax, tMin, tMax (K), protein, centre',
			'/api/v1/proteins': 'proteins; filters q, organism',
			'/api/v1/centres': 'redox centres; filters q, kind, organism, protein',
			'/api/v1/spin-records':
				'spin states and g-values; filters kind, organism, protein, centre, method, spin',
			'/api/v1/distances':
				'inter-centre distances (Å); filters organism, protein, centre, method, edgeMin, edgeMax',
			'/api/v1/entries/{accession}':
				'one entry with its version history; ?version=N for a given version'
		},
		paging:
			'limit (1–500, default 100) and cursor (pass nextCursor back unchanged); sort and order (asc, desc)',
		formats:
			'JSON by default; format=csv for CSV with the total in X-Total-Count and the next page in Link',
		errors: '{ "error": { "code", "message", "fields"? } } with codes bad_request, not_found, …',
		units: 'potentials mV vs SHE; temperature K; distances Å'
	});
