import { z } from 'zod';
import { ROLES } from '$lib/roles';

/* Admin form inputs (users, roles, groups). */

export const ROLE_VALUES = ROLES;

export const setRoleForm = z.object({
	userId: z.string().min(1, 'choose a user'),
	role: z.enum(ROLE_VALUES, { error: `expected one of ${ROLE_VALUES.join(', ')}` })
});

export const setDisabledForm = z.object({
	userId: z.string().min(1, 'choose a user'),
	disabled: z.enum(['true', 'false']).transform((v) => v === 'true')
});

export const createGroupForm = z.object({
	name: z.string().trim().min(2, 'a name of at least 2 characters').max(120),
	slug: z
		.string()
		.trim()
		.toLowerCase()
		.regex(
			/^[a-z0-9]+(?:-[a-z0-9]+)*$/,
			'lower-case letters, digits and single hyphens, e.g. demo-lab'
		)
		.max(60)
});

export const addMemberForm = z.object({
	groupId: z.coerce.number().int().positive('choose a group'),
	email: z.string().trim().toLowerCase().email('an e-mail address of an existing account')
});

export const removeMemberForm = z.object({
	groupId: z.coerce.number().int().positive(),
	userId: z.string().min(1)
});

/** A reader's request for contributor access: an optional note to the admins. */
export const accessRequestForm = z.object({
	message: z.string().trim().max(1000, 'at most 1000 characters').default('')
});

export const dismissAccessRequestForm = z.object({
	userId: z.string().min(1, 'choose a request')
});

/** /admin/users?requests=N: the page of open access requests shown (other parameters ignored). */
export const accessRequestsQuerySchema = z.object({
	requests: z.coerce
		.number({ error: 'a page number' })
		.int('a page number')
		.min(1, 'pages start at 1')
		.max(100_000, 'at most page 100000')
		.default(1)
});
