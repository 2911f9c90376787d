import { sql, type Kysely } from 'kysely';
import { submissionStateName } from '$lib/catalogue/submissionStates';
import { parseEntryData } from '$lib/schemas/entryData';
import type { VersionWarningKind } from '$lib/schemas/versionWarning';
import { readJson } from '../db/json';
import type { Database, SubmissionRow } from '../db/schema';
import { warningsForVersion, type WarningAudience } from './checks';
import type { OutgoingMail } from './outbox';

/*
 * Who hears of what. Curators choose per account: a mail for each new submission, one daily
 * digest, or nothing (the queue is always there). Contributors always hear of decisions and of
 * curators' comments on their submissions.
 */

async function curatorsToNotify(trx: Kysely<Database>, exceptUserId: string | null) {
	let q = trx
		.selectFrom('User')
		.select(['id', 'email', 'curationNotices'])
		.where('role', 'in', ['curator', 'admin'])
		.where('disabledAt', 'is', null)
		.where('email', 'is not', null)
		.where('curationNotices', '!=', 'off');
	if (exceptUserId) q = q.where('id', '!=', exceptUserId);
	return q.execute();
}

/** How many rows (a batch) or entries (a form) carry a warning of each kind. */
export type WarningCounts = Partial<Record<VersionWarningKind, number>>;

/**
 * Warning counts of a submission for one audience: a batch's stored warnings (made against what
 * its contributor may see), a form's computed now — against every approved value for curators,
 * against what the contributor may see for their own receipt.
 */
export async function submissionWarningCounts(
	trx: Kysely<Database>,
	submission: Pick<SubmissionRow, 'id' | 'channel'>,
	audience: WarningAudience
): Promise<WarningCounts> {
	const counts: WarningCounts = {};
	if (submission.channel === 'csv') {
		const rows = await sql<{ kind: VersionWarningKind; n: number }>`
			select w.value ->> 'kind' as kind, count(distinct entry_version.id) as n
			from entry_version, json_each(entry_version.warnings) as w
			where entry_version.submission_id = ${submission.id} and entry_version.warnings is not null
			group by 1`.execute(trx);
		for (const r of rows.rows) counts[r.kind] = Number(r.n);
		return counts;
	}
	const versions = await trx
		.selectFrom('entry_version')
		.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
		.select(['entry_version.data', 'entry.kind', 'entry.id as entryId'])
		.where('entry_version.submission_id', '=', submission.id)
		.execute();
	for (const v of versions) {
		const warnings = await warningsForVersion(trx, parseEntryData(v.kind, readJson(v.data)), {
			entryId: v.entryId,
			audience
		});
		for (const kind of new Set(warnings.map((w) => w.kind))) counts[kind] = (counts[kind] ?? 0) + 1;
	}
	return counts;
}

const WARNING_WORDS: Record<VersionWarningKind, string> = {
	range: 'outside the typical range for the cofactor type and couple',
	conflict: 'differing from an approved value beyond the stated uncertainties',
	duplicate: 'repeating a value already in the registry',
	other: 'with another warning'
};

/** The warnings of a submission in a sentence (counts and kinds, no values), or a no-warning line. */
export function warningSummary(
	counts: WarningCounts,
	unit: readonly [one: string, many: string]
): string {
	const parts = (Object.keys(WARNING_WORDS) as VersionWarningKind[])
		.filter((k) => (counts[k] ?? 0) > 0)
		.map((k) => `${counts[k]} ${counts[k] === 1 ? unit[0] : unit[1]} ${WARNING_WORDS[k]}`);
	return parts.length ? `Warnings: ${parts.join('; ')}.` : 'No warnings.';
}

/** The group ids of a user, for reading as they may read. */
async function viewerOfUser(trx: Kysely<Database>, userId: string) {
	const groups = await trx
		.selectFrom('group_member')
		.select('group_id')
		.where('user_id', '=', userId)
		.execute();
	return { groupIds: groups.map((g) => g.group_id) };
}

/**
 * Mails for curators who want them at once (with the submission's warnings counted by kind);
 * queued notices for those who want a digest; and the contributor's receipt.
 */
export async function noticesForNewSubmission(
	trx: Kysely<Database>,
	submission: SubmissionRow,
	origin: string
): Promise<OutgoingMail[]> {
	const submitter = submission.submitted_by
		? await trx
				.selectFrom('User')
				.select(['email', 'name'])
				.where('id', '=', submission.submitted_by)
				.executeTakeFirst()
		: undefined;
	const mails: OutgoingMail[] = [];
	const unit =
		submission.channel === 'csv' ? (['row', 'rows'] as const) : (['entry', 'entries'] as const);
	const curators = await curatorsToNotify(trx, submission.submitted_by);
	const forCurators = curators.some((c) => c.curationNotices !== 'daily')
		? warningSummary(await submissionWarningCounts(trx, submission, 'curator'), unit)
		: '';
	for (const curator of curators) {
		if (curator.curationNotices === 'daily') {
			await trx
				.insertInto('curation_notice')
				.values({ user_id: curator.id, submission_id: submission.id, sent_at: null })
				.execute();
			continue;
		}
		mails.push({
			to: curator.email as string,
			subject: `New submission #${submission.id} to review: ${submission.title}`,
			text: `${submitter?.name ?? submitter?.email ?? 'A contributor'} submitted #${submission.id} for review:\n\n  ${submission.title}\n\n${forCurators}\n\nReview it here:\n${origin}/review/${submission.id}\n\nYou receive one message per submission; choose a daily digest or no notices on your account page (${origin}/account).\n`
		});
	}
	if (submission.submitted_by && submitter?.email) {
		const own = warningSummary(
			await submissionWarningCounts(
				trx,
				submission,
				await viewerOfUser(trx, submission.submitted_by)
			),
			unit
		);
		mails.push({
			to: submitter.email,
			subject: `Received: submission #${submission.id}, ${submissionStateName('submitted')}`,
			text: `Your submission #${submission.id} is ${submissionStateName('submitted')}:\n\n  ${submission.title}\n\n${own}\n\nA curator will approve it, return it for changes, or reject it; you will hear by e-mail. Follow it here:\n${origin}/submissions/${submission.id}\n`
		});
	}
	return mails;
}

const DECISION_WORDS = {
	approve: 'approved',
	return: 'returned for changes',
	reject: 'rejected'
} as const;

export async function outcomeMail(
	trx: Kysely<Database>,
	submission: SubmissionRow,
	decision: keyof typeof DECISION_WORDS,
	comment: string,
	origin: string,
	approved: readonly { accession: string; version: number }[]
): Promise<OutgoingMail[]> {
	const to = await submitterEmail(trx, submission);
	if (!to) return [];
	const links = approved.map((a) => `  ${origin}/e/${a.accession}/v${a.version}`).join('\n');
	const body = [
		`Your submission #${submission.id} was ${DECISION_WORDS[decision]}:`,
		`  ${submission.title}`,
		comment ? `\nThe curator wrote:\n${comment}` : '',
		approved.length ? `\nIt is now in the registry at:\n${links}` : '',
		decision === 'return'
			? `\nMake the changes and submit it again here:\n${origin}/submissions/${submission.id}`
			: `\nThe submission: ${origin}/submissions/${submission.id}`
	];
	return [
		{
			to,
			subject: `Submission #${submission.id} ${DECISION_WORDS[decision]}`,
			text: body.filter(Boolean).join('\n') + '\n'
		}
	];
}

export async function commentMail(
	trx: Kysely<Database>,
	submission: SubmissionRow,
	authorName: string,
	body: string,
	origin: string
): Promise<OutgoingMail[]> {
	const to = await submitterEmail(trx, submission);
	if (!to) return [];
	return [
		{
			to,
			subject: `New comment on submission #${submission.id}`,
			text: `${authorName} commented on your submission #${submission.id} (${submission.title}):\n\n${body}\n\nReply here: ${origin}/submissions/${submission.id}\n`
		}
	];
}

async function submitterEmail(trx: Kysely<Database>, submission: SubmissionRow) {
	if (!submission.submitted_by) return null;
	const user = await trx
		.selectFrom('User')
		.select('email')
		.where('id', '=', submission.submitted_by)
		.where('disabledAt', 'is', null)
		.executeTakeFirst();
	return user?.email ?? null;
}

/**
 * Digests due at `now`: for each curator on the daily choice with queued notices, one mail
 * listing them, sent no earlier than `hourUtc` and at most once a calendar day (UTC). Marks
 * the notices sent in the same transaction as it returns the mails.
 */
export async function dueDigests(
	trx: Kysely<Database>,
	options: { now: Date; hourUtc: number; origin: string }
): Promise<OutgoingMail[]> {
	if (options.now.getUTCHours() < options.hourUtc) return [];
	const today = options.now.toISOString().slice(0, 10);
	const curators = await trx
		.selectFrom('User')
		.select(['id', 'email', 'lastDigestAt'])
		.where('curationNotices', '=', 'daily')
		.where('disabledAt', 'is', null)
		.where('email', 'is not', null)
		.execute();
	const mails: OutgoingMail[] = [];
	for (const curator of curators) {
		if (curator.lastDigestAt && curator.lastDigestAt.slice(0, 10) >= today) continue;
		const pending = await trx
			.selectFrom('curation_notice')
			.innerJoin('submission', 'submission.id', 'curation_notice.submission_id')
			.select([
				'curation_notice.id',
				'submission.id as submissionId',
				'submission.title',
				'submission.status'
			])
			.where('curation_notice.user_id', '=', curator.id)
			.where('curation_notice.sent_at', 'is', null)
			.orderBy('submission.id')
			.execute();
		if (pending.length === 0) continue;
		const stamp = options.now.toISOString();
		await trx
			.updateTable('curation_notice')
			.set({ sent_at: stamp })
			.where(
				'id',
				'in',
				pending.map((p) => p.id)
			)
			.execute();
		await trx
			.updateTable('User')
			.set({ lastDigestAt: stamp })
			.where('id', '=', curator.id)
			.execute();
		const lines = pending.map(
			(p) =>
				`  #${p.submissionId} [${submissionStateName(p.status)}] ${p.title}\n    ${options.origin}/review/${p.submissionId}`
		);
		mails.push({
			to: curator.email as string,
			subject: `Hopline daily digest: ${pending.length} new submission${pending.length === 1 ? '' : 's'}`,
			text: `Submitted since your last digest:\n\n${lines.join('\n')}\n\nThe review queue: ${options.origin}/review\n`
		});
	}
	return mails;
}
