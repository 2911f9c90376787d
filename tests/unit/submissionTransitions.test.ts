import { describe, expect, it } from 'vitest';
import { SubmissionStateError } from '$lib/server/curation/errors';
import {
	SUBMISSION_ACTIONS,
	SUBMISSION_STATUSES,
	allowedActions,
	allows,
	nextStatus,
	type SubmissionAction
} from '$lib/server/curation/transitions';
import type { SubmissionStatus } from '$lib/server/db/schema';

/**
 * The submission workflow as DEVELOPERS.md ("Curation") describes it: draft → submitted →
 * approved | returned | rejected (a batch also partially approved); draft, submitted and
 * returned can be withdrawn; returned goes back to submitted when resubmitted; the contributor
 * edits only drafts and returned submissions; anyone concerned comments until it is withdrawn.
 * Written out here, pair by pair, as the oracle for the table in transitions.ts.
 */
const ALLOWED: [SubmissionStatus, SubmissionAction, SubmissionStatus][] = [
	['draft', 'edit', 'draft'],
	['draft', 'submit', 'submitted'],
	['draft', 'withdraw', 'withdrawn'],
	['draft', 'comment', 'draft'],
	['submitted', 'approve', 'approved'],
	['submitted', 'approve_in_part', 'partially_approved'],
	['submitted', 'return', 'returned'],
	['submitted', 'reject', 'rejected'],
	['submitted', 'withdraw', 'withdrawn'],
	['submitted', 'comment', 'submitted'],
	['returned', 'edit', 'returned'],
	['returned', 'submit', 'submitted'],
	['returned', 'withdraw', 'withdrawn'],
	['returned', 'comment', 'returned'],
	['approved', 'comment', 'approved'],
	['partially_approved', 'comment', 'partially_approved'],
	['rejected', 'comment', 'rejected']
];

describe('submission transitions', () => {
	it('lists every state of the database type once', () => {
		const all: Record<SubmissionStatus, true> = {
			draft: true,
			submitted: true,
			returned: true,
			approved: true,
			partially_approved: true,
			rejected: true,
			withdrawn: true
		};
		expect([...SUBMISSION_STATUSES].sort()).toEqual(Object.keys(all).sort());
	});

	const pairs = SUBMISSION_STATUSES.flatMap((status) =>
		SUBMISSION_ACTIONS.map((action) => [status, action] as const)
	);
	it('covers 7 states × 8 actions', () => expect(pairs).toHaveLength(56));

	it.each(pairs)('%s + %s', (status, action) => {
		const expected = ALLOWED.find(([s, a]) => s === status && a === action)?.[2];
		// What pages offer is the same table.
		expect(allowedActions(status)[action]).toBe(expected !== undefined);
		if (expected) {
			expect(allows(status, action)).toBe(true);
			expect(nextStatus(status, action, 7)).toBe(expected);
		} else {
			expect(allows(status, action)).toBe(false);
			let thrown: unknown;
			try {
				nextStatus(status, action, 7);
			} catch (e) {
				thrown = e;
			}
			expect(thrown).toBeInstanceOf(SubmissionStateError);
			expect((thrown as SubmissionStateError).code).toBe('conflict');
			expect((thrown as Error).message).toMatch(new RegExp(`^submission 7 (is|was) `));
		}
	});

	it('keeps the wording services answered with before the table', () => {
		const refusal = (status: SubmissionStatus, action: SubmissionAction) => {
			try {
				nextStatus(status, action, 3);
			} catch (e) {
				return (e as Error).message;
			}
			return null;
		};
		expect(refusal('approved', 'edit')).toBe(
			'submission 3 is approved; only drafts and returned submissions can be edited'
		);
		expect(refusal('submitted', 'submit')).toBe('submission 3 is already submitted');
		expect(refusal('rejected', 'withdraw')).toBe(
			'submission 3 is rejected and can no longer be withdrawn'
		);
		expect(refusal('draft', 'approve')).toBe(
			'submission 3 is draft; only submitted ones await a decision'
		);
		expect(refusal('withdrawn', 'comment')).toBe('submission 3 was withdrawn');
	});
});
