/*
 * The states of a submission and the one name each goes by wherever people read it: the status
 * badge, the queue's filter, the lists and the mails. Client-safe (no zod), so that pages showing
 * a state do not ship the schemas.
 */

export const SUBMISSION_STATES = [
	'draft',
	'submitted',
	'returned',
	'approved',
	'partially_approved',
	'rejected',
	'withdrawn'
] as const;

export type SubmissionState = (typeof SUBMISSION_STATES)[number];

/** What each state is called, in lower case (capitalise at the start of a sentence). */
export const SUBMISSION_STATE_NAMES: Record<SubmissionState, string> = {
	draft: 'draft',
	submitted: 'awaiting review',
	returned: 'returned for changes',
	approved: 'approved',
	partially_approved: 'partly approved',
	rejected: 'rejected',
	withdrawn: 'withdrawn'
};

/** The name of a state, or the text itself for one this list does not know. */
export function submissionStateName(state: string): string {
	return Object.hasOwn(SUBMISSION_STATE_NAMES, state)
		? SUBMISSION_STATE_NAMES[state as SubmissionState]
		: state;
}
