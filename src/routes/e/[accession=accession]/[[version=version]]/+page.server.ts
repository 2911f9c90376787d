import { error } from '@sveltejs/kit';
import { buildLadder } from '$lib/catalogue/ladder';
import { estimateLadderChain } from '$lib/server/calc/chainEstimate';
import { parseVersionSegment } from '$lib/schemas/accession';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { EntryNotFoundError } from '$lib/server/catalogue/errors';
import { relatedRecords } from '$lib/server/catalogue/related';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals }) => {
	const version = params.version ? (parseVersionSegment(params.version) ?? undefined) : undefined;
	const view = await getEntryView(db, params.accession, version, locals.viewer).catch(
		(e: unknown) => {
			if (e instanceof EntryNotFoundError) return null;
			throw e;
		}
	);
	if (!view) {
		error(404, {
			message:
				version === undefined
					? `There is no entry ${params.accession}.`
					: `Entry ${params.accession} has no version ${version}.`
		});
	}
	const related = await relatedRecords(db, view.kind, view.accession, locals.viewer);
	const ladder =
		view.kind === 'protein' && related
			? buildLadder(related.centres, related.potentials, related.distances)
			: null;
	const chain = ladder && related ? estimateLadderChain(ladder, related.potentials) : null;
	return { view, related, ladder, chain, pinned: params.version !== undefined };
};
