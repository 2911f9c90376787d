import { DomainError } from '$lib/domainError';
import type { FieldErrors } from '$lib/schemas/searchParams';

/* Domain failures of curation; their codes decide the HTTP answer (see `DomainError`). */

/** No such submission (or none the user may see): 404. */
export class SubmissionNotFoundError extends DomainError {
	constructor(readonly submissionId: number) {
		super('not_found', `no submission ${submissionId}`);
		this.name = 'SubmissionNotFoundError';
	}
}

/** The action does not fit the submission's state (e.g. approving a draft): 409. */
export class SubmissionStateError extends DomainError {
	constructor(message: string) {
		super('conflict', message);
		this.name = 'SubmissionStateError';
	}
}

/** The user may not act on this submission (someone else's draft, reviewing one's own): 403. */
export class SubmissionAccessError extends DomainError {
	constructor(message: string) {
		super('forbidden', message);
		this.name = 'SubmissionAccessError';
	}
}

/** The data cannot be accepted as it stands; errors per field: 400. */
export class SubmissionInvalidError extends DomainError {
	declare readonly fields: FieldErrors;

	constructor(fields: FieldErrors) {
		super(
			'bad_request',
			`the submission has errors in ${Object.keys(fields).join(', ')}: ${Object.values(fields)
				.flat()
				.join('; ')}`,
			{ fields }
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
