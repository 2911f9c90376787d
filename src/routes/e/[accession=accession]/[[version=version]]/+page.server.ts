import { pageCitation } from '$lib/catalogue/citation';
import { describeConflictRule } from '$lib/catalogue/conflicts';
import { entryHead } from '$lib/catalogue/entryMetadata';
import { buildLadder } from '$lib/catalogue/ladder';
import { distanceMatrix } from '$lib/catalogue/distanceMatrix';
import { drawLadders } from '$lib/catalogue/ladderLayout';
import { roleAtLeast } from '$lib/roles';
import { parseChainChoice } from '$lib/schemas/chainChoice';
import { planChain } from '$lib/server/calc/chainEstimate';
import { callerOf, chainEstimateFor } from '$lib/server/calc/compute';
import { parseVersionSegment } from '$lib/schemas/accession';
import { parseRelatedPages } from '$lib/schemas/relatedPages';
import { conflictFlags, conflictFlagsOfPotential } from '$lib/server/catalogue/conflictFlags';
import { getEntryView } from '$lib/server/catalogue/entryView';
import { ladderInputs } from '$lib/server/catalogue/ladderInputs';
import { relatedRecords } from '$lib/server/catalogue/related';
import { entryCitation } from '$lib/server/citations/citable';
import { negotiateEntryRepresentation } from '$lib/server/citations/negotiate';
import { db } from '$lib/server/db';
import {
	approvedVersionId,
	shownAttachmentsOfVersion
} from '$lib/server/attachments/shownAttachments';
import { attachmentStore } from '$lib/server/attachments/store';
import { orNotFound, queryError } from '$lib/server/http/failures';
import type { PageServerLoad } from './$types';
import { presentEntry } from './presentEntry';
import { shownRelated } from './shownRelated';

/**
 * A citable document: served as HTML with no hydration and no client-side router (links from it
 * are ordinary page loads); the little that needs a script is done by the page's own
 * ($lib/enhance/entryPage.ts). See DEVELOPERS.md, "Documents without hydration".
 */
export const csr = false;

/**
 * An entry at one version, with (for proteins and centres) its related records one page per
 * list, conflict flags for the potentials shown, and a protein's energy ladder — every part
 * bounded, however many records the entry has. Words, citations and the ladder's geometry are
 * made here, so that the page's script only draws them (and fills in the reader's access date).
 */
export const load: PageServerLoad = async ({
	params,
	locals,
	url,
	setHeaders,
	request,
	isDataRequest,
	getClientAddress
}) => {
	const version = params.version ? (parseVersionSegment(params.version) ?? undefined) : undefined;
	const pages = parseRelatedPages(url.searchParams);
	if (!pages.ok) queryError(pages.fields);
	const view = await orNotFound(
		getEntryView(db, params.accession, version, locals.viewer),
		version === undefined
			? `There is no entry ${params.accession}.`
			: `Entry ${params.accession} has no version ${version}.`
	);
	negotiateEntryRepresentation({ request, isDataRequest, setHeaders }, view);
	// The reader's entry, exit and conditions for the chain estimate (a 400 names a bad one).
	const choice = view.kind === 'protein' ? parseChainChoice(url.searchParams) : null;
	if (choice?.ok === false) queryError(choice.fields);
	const related = await relatedRecords(db, view.kind, view.accession, locals.viewer, pages.pages);
	const conditions = choice?.ok ? choice.choice.conditions : undefined;
	const ladderData =
		view.kind === 'protein'
			? await ladderInputs(db, view.accession, locals.viewer, conditions)
			: null;
	const ladder =
		ladderData?.ok === true
			? buildLadder(ladderData.centres, ladderData.potentials, ladderData.distances, conditions)
			: null;
	const plan =
		ladder && ladderData?.ok && choice?.ok ? planChain(ladder, ladderData, choice.choice) : null;
	if (plan?.ok === false) queryError(plan.fields);
	// Computed in a calculation worker (and kept while the chain is unchanged); a chain the
	// reader chose counts against their address when it has to be computed.
	const chain = await chainEstimateFor(
		plan?.ok ? plan.input : null,
		choice?.ok && choice.choice.chosen ? callerOf({ locals, getClientAddress }) : null
	);
	// "Busy, reload" is true of this moment only: keep this page for no one (http/readCache.ts).
	if (chain.transient) setHeaders({ 'cache-control': 'no-store' });
	// Flags for what the page shows: this potential, or the page of potentials listed.
	const conflicts =
		view.kind === 'potential'
			? await conflictFlagsOfPotential(db, view.accession, locals.viewer)
			: await conflictFlags(db, related?.potentials.items ?? [], locals.viewer);
	// The version's own attachment list, frozen with it at approval.
	const versionId = await approvedVersionId(db, view.accession, view.version);
	const attachments =
		versionId === null ? [] : await shownAttachmentsOfVersion(db, attachmentStore(), versionId);
	const citation = await entryCitation(db, view, url.origin);
	const words = presentEntry(view.kind, view.data);
	return {
		view,
		words,
		head: entryHead(citation, words.kindLabel, url.origin),
		cite: pageCitation(citation.record),
		related: related ? shownRelated(related) : null,
		ladder,
		// The protein's current distances as a matrix, from the ladder's (live data, apart from the version).
		distanceMatrix: ladderData?.ok
			? distanceMatrix(ladderData.centres, ladderData.distances)
			: null,
		ladderDrawings: ladder ? drawLadders(ladder) : null,
		ladderNote: ladderData?.ok === false ? ladderData.reason : null,
		chain: chain.estimate,
		chainNote: chain.note ?? (plan?.ok ? plan.note : null),
		chainForm: plan?.ok ? plan.form : null,
		conflicts: conflicts.flags,
		conflictsTruncated: conflicts.truncated,
		notCompared: conflicts.notCompared,
		conflictRule: describeConflictRule(),
		canPropose: locals.user !== null && roleAtLeast(locals.user.role, 'contributor'),
		pinned: params.version !== undefined,
		attachments
	};
};
