/* Domain failures of the catalogue, mapped to HTTP codes at the route. */

export class EntryNotFoundError extends Error {
	constructor(
		readonly accession: string,
		readonly version?: number
	) {
		super(
			version === undefined
				? `no entry ${accession}`
				: `entry ${accession} has no approved version ${version}`
		);
		this.name = 'EntryNotFoundError';
	}
}

/** A version refers to something that does not exist, is of the wrong kind, or does not fit. */
export class InvalidEntryDataError extends Error {
	constructor(
		readonly field: string,
		readonly detail: string
	) {
		super(`${field}: ${detail}`);
		this.name = 'InvalidEntryDataError';
	}
}

export class VersionStateError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'VersionStateError';
	}
}
