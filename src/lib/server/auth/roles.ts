import type { Role } from '../db/schema';

/**
 * The one rule for roles. Roles are ordered: each includes what the ones before it may do
 * (reader < contributor < curator < admin), so checks name the least role that suffices.
 */
export const ROLES = [
	'reader',
	'contributor',
	'curator',
	'admin'
] as const satisfies readonly Role[];

export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	groupIds: number[];
}

export class UnauthenticatedError extends Error {
	constructor() {
		super('Sign in to do this.');
		this.name = 'UnauthenticatedError';
	}
}

export class ForbiddenError extends Error {
	constructor(readonly needed: Role) {
		super(`This needs the ${needed} role.`);
		this.name = 'ForbiddenError';
	}
}

export function roleAtLeast(role: Role, least: Role): boolean {
	return ROLES.indexOf(role) >= ROLES.indexOf(least);
}

/**
 * Asserts that a user holds at least `least`.
 * @throws {UnauthenticatedError} when signed out. @throws {ForbiddenError} when the role is lower.
 */
export function assertRole(user: SessionUser | null, least: Role): asserts user is SessionUser {
	if (!user) throw new UnauthenticatedError();
	if (!roleAtLeast(user.role, least)) throw new ForbiddenError(least);
}
