/**
 * The order of roles, shared by the server (which enforces it) and pages (which only use it to
 * decide which links to show). Each role includes what the ones before it may do.
 */
export const ROLES = ['reader', 'contributor', 'curator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export function roleAtLeast(role: Role, least: Role): boolean {
	return ROLES.indexOf(role) >= ROLES.indexOf(least);
}
