import { DomainError } from '$lib/domainError';
import type { ApiTokenScope } from '$lib/schemas/apiTokenScopes';
import type { FieldErrors } from '$lib/schemas/searchParams';

/*
 * Failures of personal API tokens; their codes decide the HTTP answer (see `DomainError`). No
 * message ever repeats the token that was sent, or any part of it.
 */

export type TokenRefusal = 'scheme' | 'malformed' | 'unknown' | 'revoked' | 'expired' | 'disabled';

const REFUSALS: Record<TokenRefusal, string> = {
	scheme: 'Send an API token as "Authorization: Bearer <token>"; no other scheme is accepted.',
	malformed:
		'The bearer token is not a Hopline API token (they start with hlpat_ and have 49 characters).',
	unknown: 'The API token is not valid. Create one on /account.',
	revoked: 'The API token was revoked. Create a new one on /account.',
	expired: 'The API token has expired. Create a new one on /account.',
	disabled: 'The account this API token belongs to is disabled.'
};

/** A token that does not let anyone in (wrong, malformed, revoked, expired, owner disabled): 401. */
export class ApiTokenRefusedError extends DomainError {
	constructor(readonly reason: TokenRefusal) {
		super('unauthorized', REFUSALS[reason]);
		this.name = 'ApiTokenRefusedError';
	}
}

/** A valid token whose scope does not cover the request (a read token sending a submission): 403. */
export class ApiTokenScopeError extends DomainError {
	constructor(
		readonly held: ApiTokenScope,
		readonly needed: ApiTokenScope
	) {
		super(
			'forbidden',
			`This API token has the ${held} scope; this request needs ${needed}. Create a token with that scope on /account.`
		);
		this.name = 'ApiTokenScopeError';
	}
}

/** A token used more often than API_TOKEN_RATE_LIMIT per window: 429 with Retry-After. */
export class ApiTokenRateLimitError extends DomainError {
	declare readonly retryAfterSeconds: number;

	constructor(retryAfterSeconds: number, limit: number, windowSeconds: number) {
		super(
			'too_many_requests',
			`An API token may make ${limit} requests per ${windowSeconds} s; try again in ${retryAfterSeconds} s.`,
			{ retryAfterSeconds }
		);
		this.name = 'ApiTokenRateLimitError';
	}
}

/** What was asked for a new token cannot be given (a scope beyond the role, a date out of range): 400. */
export class ApiTokenInputError extends DomainError {
	constructor(fields: FieldErrors) {
		super('bad_request', Object.values(fields).flat().join(' '), { fields });
		this.name = 'ApiTokenInputError';
	}
}

/** Too many tokens in use at once for one account: 409. */
export class ApiTokenLimitError extends DomainError {
	constructor(readonly max: number) {
		super(
			'conflict',
			`You have ${max} tokens in use, the most an account may hold; revoke one you no longer need first.`
		);
		this.name = 'ApiTokenLimitError';
	}
}

/** No token of this id among the user's own (or it is revoked already): 404. */
export class ApiTokenNotFoundError extends DomainError {
	constructor(readonly tokenId: number) {
		super('not_found', `no API token ${tokenId} of yours in use`);
		this.name = 'ApiTokenNotFoundError';
	}
}
