import { fail } from '@sveltejs/kit';
import { lookUpDoi } from '../sources/doiService';

/**
 * The "fill from DOI" step of the source form, shared by the new-entry and draft pages: the
 * posted values come back with title, authors, journal and year filled in, or with a message on
 * the DOI field saying why not (the form still works by hand).
 */
export async function fillFromDoi(form: FormData) {
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	if (!values.doi?.trim()) {
		return fail(400, { values, errors: { doi: ['enter a DOI to look up'] } });
	}
	const found = await lookUpDoi(values.doi);
	if (!found.ok) {
		const status = {
			malformed: 400,
			not_found: 404,
			timeout: 504,
			unavailable: 502,
			bad_response: 502
		}[found.reason];
		return fail(status, { values, errors: { doi: [found.message] } });
	}
	const m = found.metadata;
	return {
		values: {
			...values,
			sourceKind: 'publication',
			doi: m.doi,
			title: m.title,
			authors: m.authors.join('\n'),
			journal: m.journal ?? '',
			year: m.year === null ? '' : String(m.year)
		},
		filled: `Filled from the DOI record of ${m.doi}. Check the fields, then save or submit.`
	};
}
