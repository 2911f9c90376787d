import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { compareVersions } from '$lib/server/catalogue/entryView';
import { EntryNotFoundError } from '$lib/server/catalogue/errors';
import { queryInteger, parseSearchParams } from '$lib/schemas/searchParams';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

const compareQuery = z.object({ from: queryInteger(1, 999_999), to: queryInteger(1, 999_999) });

export const load: PageServerLoad = async ({ params, url, locals }) => {
	const query = parseSearchParams(compareQuery, url.searchParams);
	if (!query.ok) error(400, { message: 'Choose two versions to compare.', fields: query.fields });
	const { from, to } = query.data;
	const result = await compareVersions(db, params.accession, from, to, locals.viewer).catch(
		(e: unknown) => {
			if (e instanceof EntryNotFoundError) return null;
			throw e;
		}
	);
	if (!result)
		error(404, { message: `Entry ${params.accession} has no version ${from} or ${to}.` });
	return { accession: params.accession, ...result };
};
