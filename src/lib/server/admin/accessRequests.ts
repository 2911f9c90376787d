import type { Kysely } from 'kysely';
import { DomainError } from '$lib/domainError';
import type { Database } from '../db/schema';
import { writeAudit } from '../audit/log';
import { roleAtLeast, type SessionUser } from '../auth/roles';
import type { OutgoingMail } from '../curation/outbox';

/*
 * Requests for contributor access. A reader asks (from the page that refused them, or /access);
 * every active admin gets a mail and sees the request on /admin/users, where giving the role
 * closes it (setUserRole) or "Dismiss" does. One open request per user (a unique index, migration
 * 0012), and no new one within ACCESS_REQUEST_INTERVAL_HOURS of the last, so nobody can flood the
 * admins' mailboxes.
 */

/** A request that cannot be made now: 409 (open already, or a role that has it) or 429. */
export class AccessRequestError extends DomainError {
	constructor(code: 'conflict' | 'too_many_requests', message: string, retryAfterSeconds?: number) {
		super(code, message, { retryAfterSeconds });
		this.name = 'AccessRequestError';
	}
}

export interface AccessRequestView {
	id: number;
	userId: string;
	name: string | null;
	email: string | null;
	role: 'contributor';
	message: string | null;
	createdAt: string;
}

/** The user's latest request, if any (for the page that offers to ask). */
export async function latestAccessRequest(db: Kysely<Database>, userId: string) {
	return db
		.selectFrom('access_request')
		.select(['id', 'status', 'created_at as createdAt', 'closed_at as closedAt'])
		.where('user_id', '=', userId)
		.orderBy('created_at', 'desc')
		.orderBy('id', 'desc')
		.limit(1)
		.executeTakeFirst();
}

/**
 * Records a reader's request for the contributor role and returns the mails to the admins.
 * @throws {AccessRequestError} when the user has the role already, has a request open, or asked
 * less than `intervalHours` ago.
 */
export async function requestContributorAccess(
	trx: Kysely<Database>,
	user: SessionUser,
	input: { message: string; origin: string; intervalHours: number; now?: Date }
): Promise<{ mails: OutgoingMail[] }> {
	if (roleAtLeast(user.role, 'contributor')) {
		throw new AccessRequestError(
			'conflict',
			`You have the ${user.role} role already: you can submit entries.`
		);
	}
	const now = input.now ?? new Date();
	const last = await latestAccessRequest(trx, user.id);
	if (last?.status === 'open') {
		throw new AccessRequestError(
			'conflict',
			`You asked on ${last.createdAt.slice(0, 10)}; an admin will answer that request.`
		);
	}
	if (last) {
		const nextAt = Date.parse(last.createdAt) + input.intervalHours * 3_600_000;
		if (nextAt > now.getTime()) {
			throw new AccessRequestError(
				'too_many_requests',
				`You asked less than ${input.intervalHours} hours ago; you can ask again from ${new Date(nextAt).toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
				Math.ceil((nextAt - now.getTime()) / 1000)
			);
		}
	}
	const message = input.message.trim() || null;
	const { id } = await trx
		.insertInto('access_request')
		.values({
			user_id: user.id,
			role: 'contributor',
			status: 'open',
			message,
			created_at: now.toISOString()
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	await writeAudit(trx, {
		actorId: user.id,
		action: 'access.request',
		after: { userId: user.id, role: 'contributor' },
		detail: message,
		at: now.toISOString()
	});
	const admins = await trx
		.selectFrom('User')
		.select('email')
		.where('role', '=', 'admin')
		.where('disabledAt', 'is', null)
		.where('email', 'is not', null)
		.execute();
	const who = user.name ? `${user.name} (${user.email})` : user.email;
	return {
		mails: admins.map((a) => ({
			to: a.email as string,
			subject: `Request for contributor access from ${user.name ?? user.email}`,
			text:
				`${who} asks for the contributor role, to submit entries for review.\n` +
				(message ? `\nTheir note:\n${message}\n` : '') +
				`\nGive the role, or dismiss the request, on ${input.origin}/admin/users#access-requests\n` +
				`(request #${id}).\n`
		}))
	};
}

/** Open requests listed per page on /admin/users. */
export const ACCESS_REQUESTS_PAGE_SIZE = 25;

export interface AccessRequestPage {
	items: AccessRequestView[];
	total: number;
	/** 1-based; past the last page it is the last page (a request closed meanwhile). */
	page: number;
	pageCount: number;
	pageSize: number;
}

/**
 * One page of the open requests, oldest first, for admins. Paged because anyone signed in may
 * ask: the list is as long as the crowd of readers, and the page must stay small however long.
 */
export async function openAccessRequests(
	db: Kysely<Database>,
	options: { page?: number; pageSize?: number } = {}
): Promise<AccessRequestPage> {
	const pageSize = options.pageSize ?? ACCESS_REQUESTS_PAGE_SIZE;
	const counted = await db
		.selectFrom('access_request')
		.select((eb) => eb.fn.countAll<number>().as('n'))
		.where('status', '=', 'open')
		.executeTakeFirstOrThrow();
	const total = Number(counted.n);
	const pageCount = Math.max(1, Math.ceil(total / pageSize));
	const page = Math.min(Math.max(1, options.page ?? 1), pageCount);
	const rows = await db
		.selectFrom('access_request')
		.innerJoin('User', 'User.id', 'access_request.user_id')
		.select([
			'access_request.id',
			'access_request.user_id as userId',
			'access_request.role',
			'access_request.message',
			'access_request.created_at as createdAt',
			'User.name',
			'User.email'
		])
		.where('access_request.status', '=', 'open')
		.orderBy('access_request.created_at')
		.orderBy('access_request.id')
		.limit(pageSize)
		.offset((page - 1) * pageSize)
		.execute();
	return { items: rows, total, page, pageCount, pageSize };
}

/** Closes a user's open request (given the role, or dismissed); false when none was open. */
export async function closeAccessRequests(
	trx: Kysely<Database>,
	actorId: string,
	userId: string,
	status: 'granted' | 'dismissed'
): Promise<boolean> {
	const open = await trx
		.selectFrom('access_request')
		.select(['id', 'role'])
		.where('user_id', '=', userId)
		.where('status', '=', 'open')
		.executeTakeFirst();
	if (!open) return false;
	await trx
		.updateTable('access_request')
		.set({ status, closed_at: new Date().toISOString(), closed_by: actorId })
		.where('id', '=', open.id)
		.execute();
	if (status === 'dismissed') {
		await writeAudit(trx, {
			actorId,
			action: 'access.dismiss',
			before: { userId, role: open.role },
			after: { userId, status }
		});
	}
	return true;
}
