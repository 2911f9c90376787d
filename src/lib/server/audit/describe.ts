import type { Kysely } from 'kysely';
import { diffEntryData } from '$lib/catalogue/diff';
import { submissionStateName } from '$lib/catalogue/submissionStates';
import { ENTRY_KIND_LABELS, fieldLabel, formatKindField, isEntryKind } from '$lib/kinds';
import type { Database, EntryKind } from '../db/schema';
import type { listAudit } from './log';

/*
 * The audit log in words: each record as a sentence ("approved potential HL000122 v1", "changed
 * the role of Ada Lovelace from reader to contributor") with links to what it names, and what
 * it changed as a field-by-field difference of its before and after. People are named by their
 * name (else their e-mail address), never by an id.
 */

type AuditRow = Awaited<ReturnType<typeof listAudit>>['rows'][number];

/** A piece of a sentence: text, linked when it names a page. */
export interface Phrase {
	text: string;
	href?: string;
}

export interface AuditChange {
	field: string;
	before: string;
	after: string;
}

export interface AuditLine {
	id: number;
	at: string;
	action: string;
	who: string;
	sentence: Phrase[];
	changes: AuditChange[];
	detail: string | null;
}

/** Ids inside before/after that stand for the row's page or for nothing a reader needs. */
const HIDDEN_KEYS = new Set(['userId', 'groupId', 'versionId', 'tokenId', 'id', 'sha256']);

const LABELS: Record<string, string> = {
	status: 'status',
	role: 'role',
	disabledAt: 'disabled since',
	visibility: 'visibility',
	groupId: 'group',
	embargoUntil: 'embargoed until',
	version: 'version',
	approved: 'rows approved',
	returnedRows: 'rows returned',
	name: 'name',
	slug: 'short name',
	scope: 'scope',
	expiresAt: 'expires',
	orcid: 'ORCID iD',
	curationNotices: 'review notices',
	file: 'file',
	rows: 'rows',
	entries: 'entries',
	kind: 'entry type',
	warnings: 'rows with warnings',
	proteins: 'new proteins'
};

function parse(json: string | null): Record<string, unknown> {
	if (!json) return {};
	try {
		const value: unknown = JSON.parse(json);
		return value && typeof value === 'object' && !Array.isArray(value)
			? (value as Record<string, unknown>)
			: { value };
	} catch {
		return { value: json };
	}
}

function plain(value: unknown): string {
	if (value === null || value === undefined || value === '') return '—';
	if (Array.isArray(value)) return value.length ? value.map(plain).join(', ') : '—';
	if (typeof value === 'object') return JSON.stringify(value);
	return String(value);
}

/**
 * The fields of a before/after pair that differ, labelled: an entry's data by its kind's field
 * labels, a state by its name, and internal ids left out.
 */
export function auditChanges(
	before: Record<string, unknown>,
	after: Record<string, unknown>,
	kind: EntryKind | null
): AuditChange[] {
	const flat = (o: Record<string, unknown>) => {
		const out: Record<string, unknown> = {};
		for (const [k, v] of Object.entries(o)) {
			if (k === 'data' && v && typeof v === 'object' && !Array.isArray(v)) {
				for (const [f, fv] of Object.entries(v)) out[`data.${f}`] = fv;
			} else if (k === 'visibility' && v && typeof v === 'object' && !Array.isArray(v)) {
				// Stored as a word before an edit and as {visibility, groupId, embargoUntil} after.
				const { visibility, embargoUntil } = v as Record<string, unknown>;
				out.visibility = visibility;
				if (embargoUntil) out.embargoUntil = embargoUntil;
			} else out[k] = v;
		}
		return out;
	};
	return diffEntryData(flat(before), flat(after))
		.filter((c) => !HIDDEN_KEYS.has(c.field))
		.map((c) => {
			const field = c.field.startsWith('data.') ? c.field.slice(5) : null;
			const show = (v: unknown) =>
				field && kind
					? v === null
						? '—'
						: formatKindField(kind, field, v)
					: c.field === 'status'
						? submissionStateName(plain(v))
						: plain(v);
			return {
				field: field && kind ? fieldLabel(kind, field) : (LABELS[c.field] ?? c.field),
				before: show(c.before),
				after: show(c.after)
			};
		});
}

/** Names of the people and groups the records mention, by id. */
async function namesOf(db: Kysely<Database>, rows: readonly AuditRow[]) {
	const userIds = new Set<string>();
	const groupIds = new Set<number>();
	for (const r of rows) {
		for (const side of [parse(r.before), parse(r.after)]) {
			if (typeof side.userId === 'string') userIds.add(side.userId);
			if (typeof side.groupId === 'number') groupIds.add(side.groupId);
		}
	}
	const users = userIds.size
		? await db
				.selectFrom('User')
				.select(['id', 'name', 'email'])
				.where('id', 'in', [...userIds])
				.execute()
		: [];
	const groups = groupIds.size
		? await db
				.selectFrom('research_group')
				.select(['id', 'name'])
				.where('id', 'in', [...groupIds])
				.execute()
		: [];
	return {
		user: new Map(users.map((u) => [u.id, u.name ?? u.email ?? 'a former account'])),
		group: new Map(groups.map((g) => [g.id, g.name]))
	};
}

function sentence(
	r: AuditRow,
	before: Record<string, unknown>,
	after: Record<string, unknown>,
	names: Awaited<ReturnType<typeof namesOf>>
): Phrase[] {
	const kind = r.kind && isEntryKind(r.kind) ? ENTRY_KIND_LABELS[r.kind].toLowerCase() : 'entry';
	const entry: Phrase = r.accession
		? { text: `${kind} ${r.accession}`, href: `/e/${r.accession}` }
		: { text: 'an entry' };
	const sub: Phrase = r.submissionId
		? { text: `submission #${r.submissionId}`, href: `/review/${r.submissionId}` }
		: { text: 'a submission' };
	const userId = (typeof after.userId === 'string' ? after.userId : before.userId) as
		string | undefined;
	const person: Phrase = { text: (userId && names.user.get(userId)) ?? 'an account' };
	const groupId = (typeof after.groupId === 'number' ? after.groupId : before.groupId) as
		number | undefined;
	const group: Phrase = {
		text: (groupId !== undefined ? names.group.get(groupId) : undefined) ?? 'a group'
	};
	const t = (text: string): Phrase => ({ text });
	switch (r.action) {
		case 'version.approve':
			return r.accession
				? [
						t('approved '),
						{
							text: `${kind} ${r.accession} v${plain(after.version)}`,
							href: `/e/${r.accession}/v${plain(after.version)}`
						}
					]
				: [t('approved a version')];
		case 'entry.visibility':
			return [t('changed the visibility of '), entry];
		case 'submission.create':
			return [t('started '), sub, ...(r.accession ? [t(' ('), entry, t(')')] : [])];
		case 'submission.edit':
			return [t('edited '), sub, ...(r.accession ? [t(' ('), entry, t(')')] : [])];
		case 'submission.submit':
			return [t('sent '), sub, t(' for review')];
		case 'submission.resubmit':
			return [t('sent '), sub, t(' for review again')];
		case 'submission.withdraw':
			return [t('withdrew '), sub];
		case 'submission.upload':
			return [t(`uploaded ${plain(after.file)} (${plain(after.rows)} rows) as `), sub];
		case 'review.approve':
			return [t('approved '), sub];
		case 'review.return':
			return [t('returned '), sub, t(' for changes')];
		case 'review.reject':
			return [t('rejected '), sub];
		case 'review.batch': {
			const returned = Array.isArray(after.returnedRows) ? after.returnedRows.length : 0;
			return [
				t('decided on '),
				sub,
				t(`: ${plain(after.approved)} rows approved${returned ? `, ${returned} returned` : ''}`)
			];
		}
		case 'comment.add':
			return [t('commented on '), sub];
		case 'user.role':
			return [
				t('changed the role of '),
				person,
				t(` from ${plain(before.role)} to ${plain(after.role)}`)
			];
		case 'user.disable':
			return [t('disabled the account of '), person];
		case 'user.enable':
			return [t('enabled the account of '), person];
		case 'group.create':
			return [t(`created the group ${plain(after.name)}`)];
		case 'group.add_member':
			return [t('added '), person, t(' to '), group];
		case 'group.remove_member':
			return [t('removed '), person, t(' from '), group];
		case 'access.request':
			return [t(`asked for ${plain(after.role)} access`)];
		case 'access.dismiss':
			return [t('dismissed the request of '), person, t(` for ${plain(before.role)} access`)];
		case 'account.notices':
			return [t(`chose review notices: ${plain(after.curationNotices)}`)];
		case 'account.sign_out_everywhere':
			return [t('signed out everywhere')];
		case 'account.api_token_create':
			return [t(`created the API token “${plain(after.name)}” (${plain(after.scope)})`)];
		case 'account.api_token_revoke':
			return [t(`revoked the API token “${plain(before.name)}”`)];
		case 'account.orcid':
			return [t('changed their ORCID iD')];
		default:
			return [t(r.action), ...(r.submissionId ? [t(' on '), sub] : [])];
	}
}

/** The page's records in words, with their differences. */
export async function describeAudit(
	db: Kysely<Database>,
	rows: readonly AuditRow[]
): Promise<AuditLine[]> {
	const names = await namesOf(db, rows);
	return rows.map((r) => {
		const before = parse(r.before);
		const after = parse(r.after);
		const kind = r.kind && isEntryKind(r.kind) ? r.kind : null;
		return {
			id: r.id,
			at: r.at,
			action: r.action,
			who:
				r.actorName ?? r.actorEmail ?? (r.action === 'version.approve' ? 'the registry' : 'system'),
			sentence: sentence(r, before, after, names),
			// An approval's record names the version; there is nothing else to compare.
			changes: r.action === 'version.approve' ? [] : auditChanges(before, after, kind),
			detail: r.detail
		};
	});
}
