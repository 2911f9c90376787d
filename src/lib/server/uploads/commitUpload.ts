import type { Kysely } from 'kysely';
import { setImmediate } from 'node:timers/promises';
import { DomainError } from '$lib/domainError';
import { UPLOAD_KIND_NOUNS } from '$lib/kinds';
import { storeWarnings, type VersionWarning } from '$lib/schemas/versionWarning';
import type { SessionUser } from '../auth/roles';
import { writeAudit } from '../audit/log';
import type { Database } from '../db/schema';
import { allocateEntries, type AllocatedEntry, type VisibilityChange } from '../catalogue/entries';
import { assertGroupAllowed } from '../curation/submissions';
import { noticesForNewSubmission } from '../curation/notices';
import { assertPendingRoom } from '../curation/pending';
import type { OutgoingMail } from '../curation/outbox';
import type { UploadCheck } from './checkUpload';

/*
 * Commits a checked CSV file as one submission awaiting review: every new protein and entry,
 * each with its submitted version, in the caller's transaction — all rows or none. Entries are
 * made by `allocateEntries`; versions go in as multi-row inserts in chunks, yielding to the event
 * loop between chunks.
 */
export class UploadHasErrorsError extends DomainError {
	constructor(readonly errorCount: number) {
		super(
			'bad_request',
			`the file has ${errorCount} error(s); fix them and check it again before committing`
		);
		this.name = 'UploadHasErrorsError';
	}
}

// 500 rows × 14 columns: well under SQLite's 32 766 bound parameters, and a short pause each.
const CHUNK_ROWS = 500;

export interface CommitResult {
	submissionId: number;
	created: number;
	mails: OutgoingMail[];
}

export async function commitUpload(
	trx: Kysely<Database>,
	user: SessionUser,
	check: UploadCheck,
	meta: {
		filename: string;
		visibility: VisibilityChange;
		changeNote: string | null;
		origin: string;
		pendingRowsMax: number;
		/** The submission's title when the batch was not a CSV file (e.g. distances from a structure). */
		title?: string;
	}
): Promise<CommitResult> {
	if (check.errorCount > 0) throw new UploadHasErrorsError(check.errorCount);
	await assertGroupAllowed(trx, user, meta.visibility);
	const now = new Date().toISOString();
	const total = check.proteins.length + check.entries.length;
	await assertPendingRoom(trx, user.id, total, meta.pendingRowsMax);
	const { id: submissionId } = await trx
		.insertInto('submission')
		.values({
			channel: 'csv',
			status: 'submitted',
			title:
				meta.title ??
				`CSV batch: ${check.entries.length} ${UPLOAD_KIND_NOUNS[check.kind]}${check.proteins.length ? ` and ${check.proteins.length} new protein(s)` : ''} from ${meta.filename}`,
			submitted_by: user.id,
			content_sha256: check.sha256,
			row_count: check.rowCount,
			submitted_at: now
		})
		.returning('id')
		.executeTakeFirstOrThrow();

	const proteinAccessions = new Map<string, string>();
	const planned = [
		...check.proteins.map((p) => ({
			row: p.row,
			kind: 'protein' as const,
			data: p.data as unknown,
			warnings: [] as VersionWarning[],
			proteinKey: p.key,
			newProteinKey: null as string | null
		})),
		...check.entries.map((e) => ({
			row: e.row,
			kind: e.entry.kind,
			data: e.entry.data as unknown,
			warnings: e.warnings,
			proteinKey: null as string | null,
			newProteinKey: e.newProteinKey
		}))
	];
	// Every entry with its final accession first, so that a centre's version can name the
	// accession of the protein this file creates.
	const allocated = await allocateEntries(
		trx,
		planned.map((p) => ({ kind: p.kind, createdBy: user.id }))
	);
	const ids = allocated.map((e) => e.id);
	planned.forEach((p, i) => {
		if (p.proteinKey)
			proteinAccessions.set(p.proteinKey, (allocated[i] as AllocatedEntry).accession);
	});

	for (let start = 0; start < planned.length; start += CHUNK_ROWS) {
		const chunk = planned.slice(start, start + CHUNK_ROWS);
		await trx
			.insertInto('entry_version')
			.values(
				chunk.map((p, j) => {
					const data =
						p.newProteinKey !== null
							? {
									...(p.data as Record<string, unknown>),
									proteinAccession: proteinAccessions.get(p.newProteinKey)
								}
							: p.data;
					return {
						entry_id: ids[start + j] as number,
						version: null,
						status: 'submitted' as const,
						data: JSON.stringify(data),
						change_note: meta.changeNote,
						submission_id: submissionId,
						based_on_version: null,
						created_by: user.id,
						visibility: meta.visibility.visibility,
						group_id: meta.visibility.groupId,
						embargo_until: meta.visibility.embargoUntil,
						row_number: p.row,
						warnings: storeWarnings(p.warnings)
					};
				})
			)
			.execute();
		await setImmediate();
	}

	await writeAudit(trx, {
		actorId: user.id,
		action: 'submission.upload',
		submissionId,
		after: {
			kind: check.kind,
			file: meta.filename,
			sha256: check.sha256,
			rows: check.rowCount,
			entries: check.entries.length,
			proteins: check.proteins.length,
			warnings: check.warningCount
		}
	});
	const submission = await trx
		.selectFrom('submission')
		.selectAll()
		.where('id', '=', submissionId)
		.executeTakeFirstOrThrow();
	return {
		submissionId,
		created: total,
		mails: await noticesForNewSubmission(trx, submission, meta.origin)
	};
}
