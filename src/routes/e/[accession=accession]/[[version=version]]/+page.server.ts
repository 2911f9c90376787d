import { error } from '@sveltejs/kit';
import { buildLadder } from '$lib/catalogue/ladder';
import { ladderChainInput } from '$lib/server/calc/chainEstimate';
import { chainEstimateFor } from '$lib/server/calc/compute';
import { parseVersionSegment } from '$lib/schemas/accession';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { EntryNotFoundError } from '$lib/server/catalogue/errors';
import { relatedRecords } from '$lib/server/catalogue/related';
import { db } from '$lib/server/db';
import { listPotentials } from '$lib/server/catalogue/potentials';
import { conflictsAmong, describeConflictRule } from '$lib/catalogue/conflicts';
import { roleAtLeast } from '$lib/roles';
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
	// Computed in a calculation worker (and kept while the chain is unchanged).
	const chain = await chainEstimateFor(
		ladder && related ? ladderChainInput(ladder, related.potentials) : null
	);
	// A potential is flagged against the other approved values of its centre that it contradicts.
	const siblings =
		view.kind === 'potential' && typeof view.data.centreAccession === 'string'
			? (
					await listPotentials(
						db,
						{ centre: view.data.centreAccession },
						{ limit: 2000, offset: 0, sort: 'protein' },
						locals.viewer
					)
				).items
			: (related?.potentials ?? []);
	const conflicts = Object.fromEntries(conflictsAmong(siblings));
	return {
		view,
		related,
		ladder,
		chain: chain.estimate,
		chainNote: chain.note,
		conflicts,
		conflictRule: describeConflictRule(),
		canPropose: locals.user !== null && roleAtLeast(locals.user.role, 'contributor'),
		pinned: params.version !== undefined
	};
};
