import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { fieldLabel, formatKindField } from '$lib/kinds';
import { compareVersions } from '$lib/server/catalogue/entryView';
import { queryInteger, parseSearchParams } from '$lib/schemas/searchParams';
import { db } from '$lib/server/db';
import { orNotFound } from '$lib/server/http/failures';
import type { PageServerLoad } from './$types';

const compareQuery = z.object({ from: queryInteger(1, 999_999), to: queryInteger(1, 999_999) });

export const load: PageServerLoad = async ({ params, url, locals }) => {
	const query = parseSearchParams(compareQuery, url.searchParams);
	if (!query.ok) error(400, { message: 'Choose two versions to compare.', fields: query.fields });
	const { from, to } = query.data;
	const result = await orNotFound(
		compareVersions(db, params.accession, from, to, locals.viewer),
		`Entry ${params.accession} has no version ${from} or ${to}.`
	);
	// Labelled and formatted here, so that the page does not ship the table of kinds (with its
	// schemas) to the browser for a few labels.
	const changes = result.changes.map((change) => ({
		field: change.field,
		label: fieldLabel(result.kind, change.field),
		before: formatKindField(result.kind, change.field, change.before),
		after: formatKindField(result.kind, change.field, change.after),
		typeset: TYPESET_FIELDS.has(change.field)
	}));
	return { accession: params.accession, ...result, changes };
};

/** Fields shown as a couple or a redox state: their charges typeset. */
const TYPESET_FIELDS = new Set(['couple', 'oxidationLevel']);
