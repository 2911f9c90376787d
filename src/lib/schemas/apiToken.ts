import { z } from 'zod';
import { API_TOKEN_SCOPES, type ApiTokenScope } from './apiTokenScopes';

/*
 * Personal API tokens: the form that creates one on /account, and what the list there shows
 * (the scopes are in apiTokenScopes.ts). The tokens themselves are made, hashed and checked in
 * src/lib/server/auth/apiTokens.ts.
 */

/**
 * Every token starts with this, so that people, logs scrubbers and secret scanners can tell one
 * when they see it: `hlpat_` and 43 characters of base64url (32 random bytes).
 */
export const API_TOKEN_PREFIX = 'hlpat_';
export const API_TOKEN_PATTERN = /^hlpat_[A-Za-z0-9_-]{43}$/;

/** The furthest expiry that may be chosen, in days from today. */
export const API_TOKEN_MAX_DAYS = 5 * 366;

/** The form on /account. `expires`: a date (YYYY-MM-DD, the last day it works) or empty for never. */
export const apiTokenForm = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'a name, to tell this token from your others (e.g. "lab notebook")')
		.max(80, 'at most 80 characters'),
	scope: z.enum(API_TOKEN_SCOPES, { error: `expected one of ${API_TOKEN_SCOPES.join(', ')}` }),
	expires: z
		.string()
		.trim()
		.regex(/^(\d{4}-\d{2}-\d{2})?$/, 'a date as YYYY-MM-DD, or empty for no expiry')
		.refine((v) => v === '' || isCalendarDate(v), 'not a date in the calendar')
		.transform((v) => (v === '' ? null : v))
});
export type ApiTokenInput = z.infer<typeof apiTokenForm>;

export const revokeApiTokenForm = z.object({
	tokenId: z.coerce.number().int('a token id').positive('a token id')
});

function isCalendarDate(value: string): boolean {
	const date = new Date(`${value}T00:00:00Z`);
	return !Number.isNaN(date.getTime()) && date.toISOString().slice(0, 10) === value;
}

/** A token as its owner sees it in the list (never the token itself, which is shown once). */
export interface ApiTokenSummary {
	id: number;
	name: string;
	scope: ApiTokenScope;
	createdAt: string;
	lastUsedAt: string | null;
	/** The instant from which it is refused; null: never. */
	expiresAt: string | null;
	revokedAt: string | null;
	status: 'active' | 'expired' | 'revoked';
}
