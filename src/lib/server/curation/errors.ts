import type { FieldErrors } from '$lib/schemas/searchParams';

/* Domain failures of curation, mapped to HTTP codes at the route. */

export class SubmissionNotFoundError extends Error {
	constructor(readonly submissionId: number) {
		super(`no submission ${submissionId}`);
		this.name = 'SubmissionNotFoundError';
	}
}

/** The action does not fit the submission's state (e.g. approving a draft): 409. */
export class SubmissionStateError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'SubmissionStateError';
	}
}

/** The user may not act on this submission (someone else's draft, reviewing one's own): 403. */
export class SubmissionAccessError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'SubmissionAccessError';
	}
}

/** The data cannot be accepted as it stands; errors per field: 400. */
export class SubmissionInvalidError extends Error {
	constructor(readonly fields: FieldErrors) {
		super(
			`the submission has errors in ${Object.keys(fields).join(', ')}: ${Object.values(fields)
				.flat()
				.join('; ')}`
		);
		this.name = 'SubmissionInvalidError';
	}
}

/** A contributor already has as many rows awaiting review as one person may: 409. */
export class PendingLimitError extends SubmissionStateError {
	constructor(
		readonly pending: number,
		readonly adding: number,
		readonly limit: number
	) {
		super(
			`you have ${pending} row(s) awaiting review and this would add ${adding}; the limit is ${limit} per contributor — withdraw a submission or wait for its review`
		);
		this.name = 'PendingLimitError';
	}
}
