import type { Role } from '../db/schema';
import { DomainError } from '$lib/domainError';
import { roleAtLeast } from '$lib/roles';

/*
 * The one rule for roles. Roles are ordered (src/lib/roles.ts): each includes what the ones
 * before it may do (reader < contributor < curator < admin), so checks name the least role that
 * suffices.
 */
export { ROLES, roleAtLeast } from '$lib/roles';

export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
	role: Role;
	groupIds: number[];
}

/** Signed out where an account is needed: 401. */
export class UnauthenticatedError extends DomainError {
	constructor() {
		super('unauthorized', 'Sign in to do this.');
		this.name = 'UnauthenticatedError';
	}
}

/** Signed in with too low a role: 403. */
export class ForbiddenError extends DomainError {
	constructor(readonly needed: Role) {
		super('forbidden', `This needs the ${needed} role.`);
		this.name = 'ForbiddenError';
	}
}

/**
 * Asserts that a user holds at least `least`.
 * @throws {UnauthenticatedError} when signed out. @throws {ForbiddenError} when the role is lower.
 */
export function assertRole(user: SessionUser | null, least: Role): asserts user is SessionUser {
	if (!user) throw new UnauthenticatedError();
	if (!roleAtLeast(user.role, least)) throw new ForbiddenError(least);
}
