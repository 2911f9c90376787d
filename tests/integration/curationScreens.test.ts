import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '$lib/server/auth/roles';
import type { Database } from '$lib/server/db/schema';
import { parseEntryInput } from '$lib/schemas/submission';
import { auditQuerySchema } from '$lib/schemas/auditQuery';
import { parseSearchParams } from '$lib/schemas/searchParams';
import { setEntryVisibility } from '$lib/server/catalogue/entries';
import { referenceNames } from '$lib/server/catalogue/referenceNames';
import { describeAudit } from '$lib/server/audit/describe';
import { listAudit, writeAudit } from '$lib/server/audit/log';
import {
	AccessRequestError,
	closeAccessRequests,
	openAccessRequests,
	requestContributorAccess
} from '$lib/server/admin/accessRequests';
import { addGroupMember, setUserRole } from '$lib/server/admin/accounts';
import { createDraft, submitForReview, updateDraft } from '$lib/server/curation/submissions';
import { loadDemoScenario } from '$seed/load';
import { createTempDatabase } from '../support/tempDb';
import { insertSessionUser } from '../support/users';

/*
 * The curation and admin screens' services (issue 14 §4): referenced entries named only when
 * visible, the audit log in words and really newest first, requests for contributor access, the
 * contributor's receipt and the warning counts in curators' notices, messages that name people.
 */

let db: Kysely<Database>;
let remove: () => Promise<void>;
let reader: SessionUser;
let contributor: SessionUser;
let curator: SessionUser;
let admin: SessionUser;
let centre: string;
const origin = 'http://hopline.test';
const tx = <T>(fn: (trx: Kysely<Database>) => Promise<T>) => db.transaction().execute(fn);

function potential(centreAccession: string, reportedValue: number) {
	const parsed = parseEntryInput('potential', {
		centreAccession,
		couple: '[4Fe-4S]2+/1+',
		reportedValue,
		reportedUnit: 'mV',
		referenceElectrode: 'SHE',
		ph: 7,
		temperatureK: 298.15,
		method: 'epr_titration',
		uncertaintyMv: 10
	});
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
	return parsed.entry;
}

beforeAll(async () => {
	({ db, remove } = await createTempDatabase());
	await loadDemoScenario(db);
	reader = await insertSessionUser(db, 'reader', 'reader@lab.test');
	contributor = await insertSessionUser(db, 'contributor', 'contrib@lab.test');
	curator = await insertSessionUser(db, 'curator', 'curator@lab.test');
	admin = await insertSessionUser(db, 'admin', 'admin@lab.test');
	await db.updateTable('User').set({ name: 'Ada Reader' }).where('id', '=', reader.id).execute();
	await db
		.insertInto('research_group')
		.values({ name: 'Lab of tests', slug: 'test-lab' })
		.execute();
	reader = { ...reader, name: 'Ada Reader' };
	const row = await db
		.selectFrom('potential')
		.select('centre_accession')
		.where('couple', '=', '[4Fe-4S]2+/1+')
		.where('ph', '=', 7)
		.orderBy('entry_id')
		.executeTakeFirstOrThrow();
	centre = row.centre_accession;
});
afterAll(async () => remove());

describe('referenced entries by name', () => {
	it('names a visible centre by its title (with its protein), and nothing hidden or unknown', async () => {
		const names = await referenceNames(db, { groupIds: [] }, [centre, 'HL999998']);
		expect(Object.keys(names)).toEqual([centre]);
		expect(names[centre]?.kind).toBe('centre');
		// The centre kind's title: label (cofactor type) · protein name (server/kinds/centre.ts).
		expect(names[centre]?.title).toMatch(/^.+ \(.+\) · .+$/);

		const group = await db.selectFrom('research_group').select('id').executeTakeFirstOrThrow();
		const entry = await db
			.selectFrom('entry')
			.select('id')
			.where('accession', '=', centre)
			.executeTakeFirstOrThrow();
		await tx((trx) =>
			setEntryVisibility(trx, entry.id, {
				visibility: 'group',
				groupId: group.id,
				embargoUntil: null
			})
		);
		try {
			// Hidden from outsiders, whatever their role: no name, no kind.
			expect(await referenceNames(db, { groupIds: [] }, [centre])).toEqual({});
			// Members of the group see it named.
			expect(Object.keys(await referenceNames(db, { groupIds: [group.id] }, [centre]))).toEqual([
				centre
			]);
		} finally {
			await tx((trx) =>
				setEntryVisibility(trx, entry.id, {
					visibility: 'public',
					groupId: null,
					embargoUntil: null
				})
			);
		}
	});
});

describe('the audit log', () => {
	it('writes every time in one form and reads newest first by time, ties in written order', async () => {
		await tx(async (trx) => {
			// Written later, but earlier in time; and two in the same second written without
			// milliseconds, which as text would sort after a later time with milliseconds.
			await writeAudit(trx, {
				actorId: admin.id,
				action: 'group.create',
				at: '2031-01-01T10:00:00Z',
				after: { name: 'B' }
			});
			await writeAudit(trx, {
				actorId: admin.id,
				action: 'group.create',
				at: '2031-01-01T10:00:00.500Z',
				after: { name: 'C' }
			});
			await writeAudit(trx, {
				actorId: admin.id,
				action: 'group.create',
				at: '2030-06-01T00:00:00Z',
				after: { name: 'A' }
			});
			await writeAudit(trx, {
				actorId: admin.id,
				action: 'group.create',
				at: '2031-01-01T10:00:00.500Z',
				after: { name: 'D' }
			});
		});
		const stored = await db
			.selectFrom('audit_log')
			.select('at')
			.where('action', '=', 'group.create')
			.execute();
		expect(stored.map((r) => r.at)).toContain('2031-01-01T10:00:00.000Z');
		const page = await listAudit(db, { action: 'group', limit: 10 });
		const names = page.rows.map((r) => JSON.parse(r.after ?? '{}').name);
		expect(names).toEqual(['D', 'C', 'B', 'A']);
	});

	it('pages by (time, id) without losing or repeating records of the same instant', async () => {
		const first = await listAudit(db, { action: 'group', limit: 2 });
		expect(first.next).not.toBeNull();
		const cursor = parseSearchParams(auditQuerySchema, new URLSearchParams({ after: first.next! }));
		if (!cursor.ok) throw new Error(JSON.stringify(cursor.fields));
		const second = await listAudit(db, { action: 'group', after: cursor.data.after, limit: 2 });
		const names = [...first.rows, ...second.rows].map((r) => JSON.parse(r.after ?? '{}').name);
		expect(names).toEqual(['D', 'C', 'B', 'A']);
		expect(second.next).toBeNull();
	});

	it('filters by person (name or address), entry, and a date range', async () => {
		const byName = await listAudit(db, { actor: 'ADMIN@LAB', limit: 50 });
		expect(byName.rows.length).toBeGreaterThanOrEqual(4);
		expect(new Set(byName.rows.map((r) => r.actorEmail))).toEqual(new Set(['admin@lab.test']));
		const range = await listAudit(db, { from: '2031-01-01', to: '2031-01-01', limit: 50 });
		expect(range.rows.map((r) => JSON.parse(r.after ?? '{}').name)).toEqual(['D', 'C', 'B']);
		const bad = parseSearchParams(
			auditQuerySchema,
			new URLSearchParams({ from: '2031-02-01', to: '2031-01-01', action: 'nonsense' })
		);
		expect(bad.ok).toBe(false);
		if (!bad.ok) expect(Object.keys(bad.fields).sort()).toEqual(['action']);
		const order = parseSearchParams(
			auditQuerySchema,
			new URLSearchParams({ from: '2031-02-01', to: '2031-01-01' })
		);
		expect(order.ok ? null : order.fields.to).toEqual(['the end date comes before the start date']);
	});

	it('says what happened in words, names people, and lists what changed field by field', async () => {
		await tx((trx) => setUserRole(trx, admin.id, reader.id, 'reader'));
		const { submissionId } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential(centre, -250),
				visibility: { visibility: 'public', groupId: null, embargoUntil: null },
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		await tx((trx) =>
			updateDraft(trx, contributor, submissionId, {
				entry: potential(centre, -260),
				visibility: { visibility: 'public', groupId: null, embargoUntil: null },
				changeNote: null
			})
		);
		const page = await listAudit(db, { submissionId, limit: 10 });
		const lines = await describeAudit(db, page.rows);
		const edit = lines.find((l) => l.action === 'submission.edit');
		expect(edit?.who).toBe('contributor');
		expect(edit?.sentence.map((p) => p.text).join('')).toMatch(
			new RegExp(`^edited submission #${submissionId} \\(potential HL\\d{6}\\)$`)
		);
		// Only the fields that changed, by their labels (kinds/potential.ts), before and after:
		// the value typed and the Em converted from it (both with the Unicode minus of displayed
		// numbers); the visibility, stored in two shapes, did not.
		expect(edit?.changes.map((c) => [c.field, c.before, c.after])).toEqual([
			['Value as reported', '−250', '−260'],
			[
				expect.stringMatching(/^Em/),
				expect.stringMatching(/^−250\smV vs SHE$/u),
				expect.stringMatching(/^−260\smV vs SHE$/u)
			]
		]);

		const approvals = await listAudit(db, { accession: centre, action: 'version', limit: 1 });
		const [approval] = await describeAudit(db, approvals.rows);
		expect(approval?.sentence.map((p) => p.text).join('')).toBe(`approved centre ${centre} v1`);
		expect(approval?.sentence[1]?.href).toBe(`/e/${centre}/v1`);

		await tx((trx) => setUserRole(trx, admin.id, reader.id, 'contributor'));
		await tx((trx) => setUserRole(trx, admin.id, reader.id, 'reader'));
		const roles = await describeAudit(db, (await listAudit(db, { action: 'user', limit: 2 })).rows);
		expect(roles.map((l) => l.sentence.map((p) => p.text).join(''))).toEqual([
			'changed the role of Ada Reader from contributor to reader',
			'changed the role of Ada Reader from reader to contributor'
		]);
		expect(roles[0]?.who).toBe('admin');
		// No id hash anywhere in what is shown.
		expect(JSON.stringify(roles)).not.toContain(reader.id);
	});
});

describe('requests for contributor access', () => {
	const ask = (user: SessionUser, now: Date, message = '') =>
		tx((trx) => requestContributorAccess(trx, user, { message, origin, intervalHours: 24, now }));

	it('mails every admin, once per open request, and refuses roles that have it', async () => {
		const t0 = new Date('2032-03-01T09:00:00Z');
		const { mails } = await ask(reader, t0, 'We measure ferredoxins.');
		const admins = await db
			.selectFrom('User')
			.select('email')
			.where('role', '=', 'admin')
			.where('disabledAt', 'is', null)
			.execute();
		expect(mails.map((m) => m.to).sort()).toEqual(admins.map((a) => a.email).sort());
		expect(mails[0]?.subject).toBe('Request for contributor access from Ada Reader');
		expect(mails[0]?.text).toContain('We measure ferredoxins.');
		expect(mails[0]?.text).toContain(`${origin}/admin/users`);
		expect((await openAccessRequests(db)).items.map((r) => r.email)).toEqual(['reader@lab.test']);

		await expect(ask(reader, new Date('2032-03-05T09:00:00Z'))).rejects.toMatchObject({
			code: 'conflict'
		});
		await expect(ask(contributor, t0)).rejects.toBeInstanceOf(AccessRequestError);
	});

	it('closes the request when an admin gives the role, or dismisses it; then waits before a new one', async () => {
		await tx((trx) => closeAccessRequests(trx, admin.id, reader.id, 'dismissed'));
		expect((await openAccessRequests(db)).items).toEqual([]);
		// Dismissed one hour after a request made at 09:00: a new one only from 09:00 next day.
		await expect(ask(reader, new Date('2032-03-01T20:00:00Z'))).rejects.toMatchObject({
			code: 'too_many_requests'
		});
		await ask(reader, new Date('2032-03-02T09:00:01Z'));
		const r = await tx((trx) => setUserRole(trx, admin.id, reader.id, 'contributor'));
		expect(r).toEqual({ name: 'Ada Reader', from: 'reader', to: 'contributor' });
		expect((await openAccessRequests(db)).items).toEqual([]);
		const statuses = await db
			.selectFrom('access_request')
			.select('status')
			.where('user_id', '=', reader.id)
			.orderBy('id')
			.execute();
		expect(statuses.map((s) => s.status)).toEqual(['dismissed', 'granted']);
		await tx((trx) => setUserRole(trx, admin.id, reader.id, 'reader'));
	});

	it('lists the open requests a page at a time, oldest first', async () => {
		const readers = await Promise.all(
			[1, 2, 3, 4, 5].map((n) => insertSessionUser(db, 'reader', `asker${n}@lab.test`))
		);
		for (const [n, r] of readers.entries()) await ask(r, new Date(`2032-04-0${n + 1}T09:00:00Z`));
		const emails = async (page: number) =>
			(await openAccessRequests(db, { page, pageSize: 2 })).items.map((r) => r.email);
		expect(await emails(1)).toEqual(['asker1@lab.test', 'asker2@lab.test']);
		expect(await emails(3)).toEqual(['asker5@lab.test']);
		expect(await openAccessRequests(db, { page: 3, pageSize: 2 })).toMatchObject({
			total: 5,
			page: 3,
			pageCount: 3
		});
		// Past the end (requests closed meanwhile): the last page, not an empty one.
		expect(await emails(9)).toEqual(['asker5@lab.test']);
		expect((await openAccessRequests(db)).items).toHaveLength(5);
		for (const r of readers)
			await tx((trx) => closeAccessRequests(trx, admin.id, r.id, 'dismissed'));
	});

	it('keeps one open request per user in the database itself', async () => {
		await ask(reader, new Date('2032-04-01T09:00:00Z'));
		await expect(
			db
				.insertInto('access_request')
				.values({ user_id: reader.id, role: 'contributor', status: 'open', message: null })
				.execute()
		).rejects.toThrow(/UNIQUE/);
	});
});

describe('mail on submission', () => {
	it('sends the contributor a receipt, and tells curators the warnings by kind and count', async () => {
		const { submissionId } = await tx((trx) =>
			createDraft(trx, contributor, {
				entry: potential(centre, 250),
				visibility: { visibility: 'public', groupId: null, embargoUntil: null },
				changeNote: null,
				editAccession: null,
				pendingRowsMax: 1000
			})
		);
		const { mails } = await tx((trx) => submitForReview(trx, contributor, submissionId, origin));
		const receipt = mails.find((m) => m.to === 'contrib@lab.test');
		expect(receipt?.subject).toBe(`Received: submission #${submissionId}, awaiting review`);
		expect(receipt?.text).toContain(`${origin}/submissions/${submissionId}`);
		expect(receipt?.text).toContain('1 entry outside the typical range');
		const notice = mails.find((m) => m.to === 'curator@lab.test');
		expect(notice?.text).toContain('1 entry outside the typical range');
		// +250 mV against approved values near −250 mV at pH 7 with ±10 mV: a conflict too.
		expect(notice?.text).toContain('1 entry differing from an approved value');
	});

	it('names people and groups in what admins are told', async () => {
		const group = await db
			.selectFrom('research_group')
			.select(['id', 'name'])
			.executeTakeFirstOrThrow();
		const added = await tx((trx) => addGroupMember(trx, admin.id, group.id, 'reader@lab.test'));
		expect(added).toEqual({ name: 'Ada Reader', group: group.name });
		void curator;
	});
});
