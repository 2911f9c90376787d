import { SUBMISSION_STATES } from '$lib/catalogue/submissionStates';
import type { SubmissionStatus } from '../db/schema';
import { SubmissionStateError } from './errors';

/*
 * Where a submission may go from each state: the one table every service consults before it
 * changes a submission (or acts on it without changing its state, such as editing a draft or
 * commenting). A submission's versions move with it (see `setSubmissionStatus`).
 *
 * What the table cannot say is checked where the rows are: a batch that an unfinished approval
 * has started on (approved rows under a submitted batch) can no longer be withdrawn, rejected or
 * returned whole (`submissions.ts`, `reviews.ts`).
 */

export type SubmissionAction =
	/** The contributor changes the data of the draft (or of the returned submission). */
	| 'edit'
	/** The contributor sends it to the curators (again, when returned). */
	| 'submit'
	/** The contributor takes it back before a decision. */
	| 'withdraw'
	/** A curator approves every row. */
	| 'approve'
	/** A curator approves some rows of a batch and returns the others. */
	| 'approve_in_part'
	/** A curator sends it back for changes (a batch: every row). */
	| 'return'
	/** A curator refuses it. */
	| 'reject'
	/** The contributor or a curator adds to the thread. */
	| 'comment';

export const SUBMISSION_ACTIONS: readonly SubmissionAction[] = [
	'edit',
	'submit',
	'withdraw',
	'approve',
	'approve_in_part',
	'return',
	'reject',
	'comment'
];

/** Every state a submission can be in (one list, with the names people read them by). */
export const SUBMISSION_STATUSES: readonly SubmissionStatus[] = SUBMISSION_STATES;

/** (state, action) → the state after it; an action missing from a state's row is refused. */
export const SUBMISSION_TRANSITIONS: Readonly<
	Record<SubmissionStatus, Readonly<Partial<Record<SubmissionAction, SubmissionStatus>>>>
> = {
	draft: { edit: 'draft', submit: 'submitted', withdraw: 'withdrawn', comment: 'draft' },
	submitted: {
		approve: 'approved',
		approve_in_part: 'partially_approved',
		return: 'returned',
		reject: 'rejected',
		withdraw: 'withdrawn',
		comment: 'submitted'
	},
	returned: { edit: 'returned', submit: 'submitted', withdraw: 'withdrawn', comment: 'returned' },
	approved: { comment: 'approved' },
	partially_approved: { comment: 'partially_approved' },
	rejected: { comment: 'rejected' },
	withdrawn: {}
};

/** Why an action is refused, as the contributor or curator reads it. */
const REFUSAL: Record<SubmissionAction, (id: number, status: SubmissionStatus) => string> = {
	edit: (id, status) =>
		`submission ${id} is ${status}; only drafts and returned submissions can be edited`,
	submit: (id, status) => `submission ${id} is already ${status}`,
	withdraw: (id, status) => `submission ${id} is ${status} and can no longer be withdrawn`,
	approve: awaitsNoDecision,
	approve_in_part: awaitsNoDecision,
	return: awaitsNoDecision,
	reject: awaitsNoDecision,
	comment: (id, status) =>
		status === 'withdrawn'
			? `submission ${id} was withdrawn`
			: `submission ${id} is ${status}; its thread is closed`
};

function awaitsNoDecision(id: number, status: SubmissionStatus): string {
	return `submission ${id} is ${status}; only submitted ones await a decision`;
}

/** Whether the table allows `action` on a submission in `status`. */
export function allows(status: SubmissionStatus, action: SubmissionAction): boolean {
	return SUBMISSION_TRANSITIONS[status][action] !== undefined;
}

/** Which actions a submission in `status` allows: what pages offer it (the services decide). */
export function allowedActions(status: SubmissionStatus): Record<SubmissionAction, boolean> {
	return Object.fromEntries(SUBMISSION_ACTIONS.map((a) => [a, allows(status, a)])) as Record<
		SubmissionAction,
		boolean
	>;
}

/**
 * The state a submission moves to when `action` is taken on it (its id names it in the refusal).
 * @throws {SubmissionStateError} (409) when the action is not allowed in that state.
 */
export function nextStatus(
	status: SubmissionStatus,
	action: SubmissionAction,
	submissionId: number
): SubmissionStatus {
	const next = SUBMISSION_TRANSITIONS[status][action];
	if (next === undefined) throw new SubmissionStateError(REFUSAL[action](submissionId, status));
	return next;
}
