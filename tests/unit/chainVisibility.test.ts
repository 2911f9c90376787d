import { describe, expect, it } from 'vitest';
import {
	earlyGroup,
	potentialRowVisibility,
	publicFrom,
	type EntryVisibility,
	type Viewer
} from '$lib/server/catalogue/visibility';

/*
 * A potential's read-model row stands for a chain of three entries (potential, centre, protein)
 * with one `public_from` and one `group_id`. The product's rule (DEVELOPERS.md "Visibility") is
 * the oracle: the row may be shown only when every entry of the chain is visible to the reader,
 * an entry being visible when it is public, embargoed with its date passed, or carries one of
 * the reader's groups. The definition is written out again here, not taken from visibility.ts.
 */

const PAST = '2020-03-01T00:00:00.000Z';
const FUTURE = '2099-03-01T00:00:00.000Z';
/** A time before every future embargo ends, and one after all of them. */
const BEFORE = new Date('2030-01-01T00:00:00.000Z');
const AFTER = new Date('2100-01-01T00:00:00.000Z');

/** Every state an entry row can be in, including ones the forms never write. */
const STATES: EntryVisibility[] = [];
for (const group_id of [null, 1, 2]) {
	// A public entry with a group left over (setEntryVisibility keeps what it is given).
	STATES.push({ visibility: 'public', embargo_until: null, group_id });
	// A group-only entry without a group cannot be written, but must hide safely if it were.
	STATES.push({ visibility: 'group', embargo_until: null, group_id });
	STATES.push({ visibility: 'embargoed', embargo_until: FUTURE, group_id });
	STATES.push({ visibility: 'embargoed', embargo_until: PAST, group_id });
}

const VIEWERS: (Viewer | null)[] = [
	null,
	{ groupIds: [] },
	{ groupIds: [1] },
	{ groupIds: [2] },
	{ groupIds: [1, 2] }
];

function entryVisibleByDefinition(e: EntryVisibility, viewer: Viewer | null, at: Date): boolean {
	const mine = e.group_id !== null && viewer !== null && viewer.groupIds.includes(e.group_id);
	const open =
		e.visibility === 'public' ||
		(e.visibility === 'embargoed' &&
			e.embargo_until !== null &&
			Date.parse(e.embargo_until) <= at.getTime());
	return open || mine;
}

const chainVisibleByDefinition = (chain: EntryVisibility[], viewer: Viewer | null, at: Date) =>
	chain.every((e) => entryVisibleByDefinition(e, viewer, at));

/** What the read model answers: the row computed at `computedAt`, read at `at`. */
function rowVisible(
	chain: EntryVisibility[],
	viewer: Viewer | null,
	computedAt: Date,
	at: Date
): boolean {
	const from = publicFrom(chain);
	const group = earlyGroup(chain, computedAt);
	return potentialRowVisibility(viewer, at)(
		from === null ? Number.POSITIVE_INFINITY : Date.parse(from),
		group
	);
}

function* chains(): Generator<EntryVisibility[]> {
	for (const potential of STATES)
		for (const centre of STATES) for (const protein of STATES) yield [potential, centre, protein];
}

const describeChain = (chain: EntryVisibility[]) =>
	chain.map((e) => `${e.visibility}/${e.embargo_until ?? '-'}/${e.group_id ?? '-'}`).join(' → ');

describe('visibility of a potential row over its chain (potential → centre → protein)', () => {
	it('never shows a row unless every entry is visible, and shows it when the hidden entries share one group', () => {
		let checked = 0;
		const wrong: string[] = [];
		for (const chain of chains()) {
			// The entries still hidden from outsiders at BEFORE: the only ones that need a group.
			const hidden = chain.filter((e) => !entryVisibleByDefinition(e, null, BEFORE));
			const groups = new Set(hidden.map((e) => e.group_id));
			const sharedGroup = groups.size <= 1 && !groups.has(null);
			for (const viewer of VIEWERS) {
				const expected = chainVisibleByDefinition(chain, viewer, BEFORE);
				const got = rowVisible(chain, viewer, BEFORE, BEFORE);
				// Where the hidden entries carry one group the row is exact; otherwise (different
				// groups, or a group missing) nobody sees it before every entry is open to all.
				const wanted = sharedGroup ? expected : false;
				if (got !== wanted)
					wrong.push(`${describeChain(chain)} for ${JSON.stringify(viewer)}: ${got}`);
				checked++;
			}
		}
		expect(wrong).toEqual([]);
		expect(checked).toBe(STATES.length ** 3 * VIEWERS.length);
	});

	it('stays within the rule when read later than it was computed, and hides nothing public', () => {
		const wrong: string[] = [];
		for (const chain of chains())
			for (const viewer of VIEWERS)
				for (const [computedAt, at] of [
					[BEFORE, BEFORE],
					[BEFORE, AFTER],
					[AFTER, AFTER]
				] as const) {
					const allowed = chainVisibleByDefinition(chain, viewer, at);
					const got = rowVisible(chain, viewer, computedAt, at);
					if (got && !allowed)
						wrong.push(`${describeChain(chain)} for ${JSON.stringify(viewer)}: shown`);
					// An entry open to everyone never hides the row, whatever group it carries.
					const openToAll = chain.every((e) => entryVisibleByDefinition(e, null, at));
					if (openToAll && !got)
						wrong.push(`${describeChain(chain)} for ${JSON.stringify(viewer)}: hidden`);
				}
		expect(wrong).toEqual([]);
	});

	it('keeps a group-1 potential on a group-2 protein from both groups alone', () => {
		const chain: EntryVisibility[] = [
			{ visibility: 'group', embargo_until: null, group_id: 1 },
			{ visibility: 'public', embargo_until: null, group_id: null },
			{ visibility: 'group', embargo_until: null, group_id: 2 }
		];
		expect(earlyGroup(chain, BEFORE)).toBeNull();
		expect(rowVisible(chain, { groupIds: [1] }, BEFORE, BEFORE)).toBe(false);
		expect(rowVisible(chain, { groupIds: [2] }, BEFORE, BEFORE)).toBe(false);
	});

	it('ignores an embargo that had ended when the row was computed', () => {
		const chain: EntryVisibility[] = [
			{ visibility: 'group', embargo_until: null, group_id: 2 },
			{ visibility: 'embargoed', embargo_until: PAST, group_id: 1 },
			{ visibility: 'public', embargo_until: null, group_id: 1 }
		];
		expect(earlyGroup(chain, BEFORE)).toBe(2);
		expect(rowVisible(chain, { groupIds: [2] }, BEFORE, BEFORE)).toBe(true);
		expect(rowVisible(chain, { groupIds: [1] }, BEFORE, BEFORE)).toBe(false);
	});
});
