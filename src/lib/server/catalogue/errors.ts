import { DomainError } from '$lib/domainError';

/* Domain failures of the catalogue; their codes decide the HTTP answer (see `DomainError`). */

/** No such entry, or no such approved version of it: 404. */
export class EntryNotFoundError extends DomainError {
	constructor(
		readonly accession: string,
		readonly version?: number
	) {
		super(
			'not_found',
			version === undefined
				? `no entry ${accession}`
				: `entry ${accession} has no approved version ${version}`
		);
		this.name = 'EntryNotFoundError';
	}
}

/** A version refers to something that does not exist, is of the wrong kind, or does not fit: 400 on `field`. */
export class InvalidEntryDataError extends DomainError {
	constructor(
		readonly field: string,
		readonly detail: string
	) {
		const message = `${field}: ${detail}`;
		super('bad_request', message, { fields: { [field]: [message] } });
		this.name = 'InvalidEntryDataError';
	}
}

/** A version is not in the state the step needs (approving one that is not submitted): 409. */
export class VersionStateError extends DomainError {
	constructor(message: string) {
		super('conflict', message);
		this.name = 'VersionStateError';
	}
}

/** A page cursor that does not belong to this list, sort or order: 400 on `cursor`. */
export class CursorMismatchError extends DomainError {
	constructor(message: string) {
		super('bad_request', message, { fields: { cursor: [message] } });
		this.name = 'CursorMismatchError';
	}
}

/** An export would hold more rows than EXPORT_MAX_ROWS: 400, saying how many match. */
export class ExportTooLargeError extends DomainError {
	constructor(matching: number, max: number) {
		super(
			'bad_request',
			`${matching.toLocaleString('en')} potentials match; an export holds at most ${max.toLocaleString('en')}. Narrow the filters, or page through /api/v1/potentials with its cursors.`
		);
		this.name = 'ExportTooLargeError';
	}
}

/** EXPORT_CONCURRENCY exports are running already: 503 with Retry-After. */
export class ExportBusyError extends DomainError {
	constructor(retryAfterSeconds: number) {
		super('unavailable', 'Other exports are running; try again shortly.', { retryAfterSeconds });
		this.name = 'ExportBusyError';
	}
}
