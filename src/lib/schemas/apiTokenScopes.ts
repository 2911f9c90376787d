/*
 * The scopes of personal API tokens and what they allow, apart from the token form (apiToken.ts)
 * so that /account, which lists them, loads no schema library.
 */

/**
 * `read`: every read of the API with the owner's visibility (their groups' entries too).
 * `read+submit`: also the submission and upload-check APIs (with the contributor role).
 */
export const API_TOKEN_SCOPES = ['read', 'read+submit'] as const;
export type ApiTokenScope = (typeof API_TOKEN_SCOPES)[number];

export const API_TOKEN_SCOPE_LABELS: Record<ApiTokenScope, string> = {
	read: 'read: the API with what you may see',
	'read+submit': 'read + submit: also send submissions and check uploads'
};

/** Whether a token of scope `held` may do what needs `needed`. */
export function scopeIncludes(held: ApiTokenScope, needed: ApiTokenScope): boolean {
	return held === 'read+submit' || needed === 'read';
}
