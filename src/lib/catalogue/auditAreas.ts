/* The audit log's areas of actions (client-safe: the filter form lists them without zod). */

/** The audit log's areas, each the start of the actions it holds, with its name on the page. */
export const AUDIT_ACTION_AREAS = {
	submission: 'Submissions',
	review: 'Review decisions',
	version: 'Approved versions',
	entry: 'Entry visibility',
	comment: 'Comments',
	user: 'Users and roles',
	group: 'Groups',
	access: 'Access requests',
	account: 'Own account settings'
} as const;

export type AuditActionArea = keyof typeof AUDIT_ACTION_AREAS;
