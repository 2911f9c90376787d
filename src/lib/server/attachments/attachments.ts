import { createHash } from 'node:crypto';
import type { Kysely } from 'kysely';
import {
	attachmentMetaSchema,
	cleanFileName,
	type AttachmentKind,
	type AttachmentMetaInput
} from '$lib/schemas/attachment';
import { roleAtLeast } from '$lib/roles';
import { readSpectrumData, type SpectrumAxis } from '$lib/schemas/spectrumData';
import type { Database } from '../db/schema';
import { readJson } from '../db/json';
import type { SessionUser } from '../auth/roles';
import { findVisibleEntry } from '../catalogue/visibleEntry';
import { inspectAttachment, type Inspected, type InspectLimits } from './inspect';
import type { Renditions } from './renditions';
import type { BlobStore } from './storage';
import { AttachmentRejectedError } from './errors';

/*
 * Attachments: a file checked (inspect.ts), rendered (imaging.ts, in a worker), stored by
 * SHA-256 (storage.ts), described by a row that never changes, and listed by entry versions.
 *
 * The order of writing keeps the database from ever naming a missing file: files go to the
 * store first, rows after. A failure between the two leaves an unlisted file, which the
 * cleanup task removes; the reverse could not be repaired.
 */

export interface AttachmentDto {
	id: number;
	kind: AttachmentKind;
	role: 'image' | 'data' | 'structure';
	caption: string;
	conditions: Record<string, unknown>;
	fileName: string;
	mediaType: string;
	byteSize: number;
	sha256: string;
	width: number | null;
	height: number | null;
	preview: {
		sha256: string;
		mediaType: string;
		width: number | null;
		height: number | null;
	} | null;
	thumbnail: {
		sha256: string;
		mediaType: string;
		width: number | null;
		height: number | null;
	} | null;
	/**
	 * The spectrum's numbers (two-column text): an image's companion file, or a data
	 * attachment's own original. Served at /files/{id}/data.
	 */
	numbers: { sha256: string; byteSize: number; fileName: string } | null;
}

export interface NewAttachment {
	entryId: number;
	meta: AttachmentMetaInput;
	fileName: string;
	bytes: Uint8Array;
	role: 'image' | 'data' | 'structure';
	/** An image's companion numbers file (the data its figure was drawn from). */
	numbers?: { fileName: string; bytes: Uint8Array } | null;
	/** The uploading account; null for files the demo seed stores. */
	uploadedBy: string | null;
}

/** The x axis a kind's numbers must have, so that the plot can convert it (spectra.ts). */
export function numbersAxis(kind: AttachmentKind): SpectrumAxis {
	return kind === 'epr_spectrum' ? 'field' : kind === 'voltammogram' ? 'potential' : 'any';
}

/**
 * A header cell a spreadsheet would take for a formula (OWASP's list: = + - @, tab, CR), or null.
 * The original is served byte for byte, so such a file is refused rather than altered. Only the
 * first line holding anything is looked at: every other line was read as two numbers.
 */
function formulaCell(bytes: Uint8Array): string | null {
	const text = new TextDecoder().decode(bytes.subarray(0, 4096)).replace(/^\uFEFF/, '');
	const first = text.split(/\r\n|\n|\r/).find((line) => !/^[\s,;]*$/.test(line)) ?? '';
	for (const cell of first.split(/[,;\t]/)) {
		const t = cell.replace(/^[\s"']+/, '');
		if (/^[=+\-@]/.test(t) && !/^[+-]?(\d|\.\d)/.test(t)) return t;
	}
	return null;
}

/**
 * Refuses a numbers file the plot could not draw, naming its first problems (rows by line).
 * Called after inspectAttachment has ruled out binary files, markup and archives.
 */
function checkNumbers(bytes: Uint8Array, kind: AttachmentKind): void {
	const reading = readSpectrumData(bytes, { xAxis: numbersAxis(kind) });
	if (reading.ok) {
		const formula = formulaCell(bytes);
		if (formula !== null)
			throw new AttachmentRejectedError(
				422,
				'unreadable_numbers',
				`The numbers file's first line has a cell starting with "${formula.slice(0, 1)}" (${JSON.stringify(formula.slice(0, 40))}), which a spreadsheet would run as a formula when the file is downloaded and opened; rename the column (e.g. "Field (mT)").`
			);
		return;
	}
	const shown = reading.problems.slice(0, 5);
	const more = reading.problems.length - shown.length;
	throw new AttachmentRejectedError(
		422,
		'unreadable_numbers',
		`The numbers file cannot be plotted: ${shown.join('; ')}${more > 0 ? ` (and ${more} more)` : ''}.`
	);
}

export interface AttachmentDeps {
	store: BlobStore;
	limits: InspectLimits;
	/** Preview and thumbnail of an inspected image (imaging.ts's renderImage in the app). */
	render: (bytes: Uint8Array, photo: boolean) => Promise<Renditions>;
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/**
 * Checks, renders and stores one file, and writes its rows. The file is not yet listed by any
 * version: `listOnVersion` does that inside the caller's transaction. Throws
 * AttachmentRejectedError for a refused file.
 */
export async function createAttachment(
	db: Kysely<Database>,
	deps: AttachmentDeps,
	input: NewAttachment
): Promise<AttachmentDto> {
	const meta = attachmentMetaSchema.parse(input.meta);
	if (input.numbers && input.role !== 'image')
		throw new Error('only an image carries a companion numbers file');
	const inspected = await inspectAttachment(input.bytes, input.role, deps.limits);
	if (inspected.role === 'data') checkNumbers(input.bytes, meta.kind);
	let numbers: { sha256: string; bytes: Uint8Array; fileName: string; mime: string } | null = null;
	if (input.numbers) {
		let checked: Inspected;
		try {
			checked = await inspectAttachment(input.numbers.bytes, 'data', deps.limits);
			checkNumbers(input.numbers.bytes, meta.kind);
		} catch (e) {
			// Said of the numbers file, so that a form shows it beside that field.
			throw e instanceof AttachmentRejectedError
				? new AttachmentRejectedError(e.status, e.code, e.message, 'numbers')
				: e;
		}
		numbers = {
			sha256: sha256(input.numbers.bytes),
			bytes: input.numbers.bytes,
			fileName: cleanFileName(input.numbers.fileName),
			mime: checked.mime
		};
	}
	const original = {
		sha256: sha256(input.bytes),
		media_type: inspected.mime,
		byte_size: input.bytes.byteLength,
		width: inspected.role === 'image' ? inspected.width : null,
		height: inspected.role === 'image' ? inspected.height : null
	};
	const blobs = [original];
	let preview = null;
	let thumb = null;
	if (inspected.role === 'image') {
		const r = await deps.render(input.bytes, inspected.ext === 'jpg');
		preview = { ...r.preview, sha256: sha256(r.preview.bytes) };
		thumb = { ...r.thumbnail, sha256: sha256(r.thumbnail.bytes) };
		await deps.store.put(preview.sha256, preview.bytes, preview.mime);
		await deps.store.put(thumb.sha256, thumb.bytes, thumb.mime);
		for (const x of [preview, thumb])
			blobs.push({
				sha256: x.sha256,
				media_type: x.mime,
				byte_size: x.bytes.byteLength,
				width: x.width,
				height: x.height
			});
	}
	if (numbers) {
		await deps.store.put(numbers.sha256, numbers.bytes, numbers.mime);
		blobs.push({
			sha256: numbers.sha256,
			media_type: numbers.mime,
			byte_size: numbers.bytes.byteLength,
			width: null,
			height: null
		});
	}
	await deps.store.put(original.sha256, input.bytes, original.media_type);

	// Inside a caller's transaction (the demo seed's) the rows join it; otherwise their own.
	const writeRows = async (trx: Kysely<Database>) => {
		for (const blob of blobs)
			await trx
				.insertInto('attachment_blob')
				.values(blob)
				.onConflict((oc) => oc.column('sha256').doNothing())
				.execute();
		const row = await trx
			.insertInto('attachment')
			.values({
				entry_id: input.entryId,
				kind: meta.kind,
				role: inspected.role,
				caption: meta.caption,
				conditions: JSON.stringify(meta.conditions),
				file_name: cleanFileName(input.fileName),
				original_sha256: original.sha256,
				preview_sha256: preview?.sha256 ?? null,
				thumb_sha256: thumb?.sha256 ?? null,
				data_sha256: numbers?.sha256 ?? null,
				data_file_name: numbers?.fileName ?? null,
				uploaded_by: input.uploadedBy
			})
			.returning('id')
			.executeTakeFirstOrThrow();
		return row.id;
	};
	const id = db.isTransaction ? await writeRows(db) : await db.transaction().execute(writeRows);
	return (await attachmentsByIds(db, [id]))[0] as AttachmentDto;
}

/** Adds attachments to the end of a version's list (a draft or submitted version only). */
export async function listOnVersion(
	db: Kysely<Database>,
	entryVersionId: number,
	attachmentIds: readonly number[]
): Promise<void> {
	const version = await db
		.selectFrom('entry_version')
		.select(['status', 'entry_id'])
		.where('id', '=', entryVersionId)
		.executeTakeFirstOrThrow();
	if (version.status === 'approved')
		throw new Error('an approved version is frozen: its attachment list never changes');
	const last = await db
		.selectFrom('entry_version_attachment')
		.select((eb) => eb.fn.max('position').as('p'))
		.where('entry_version_id', '=', entryVersionId)
		.executeTakeFirst();
	let position = (last?.p ?? 0) + 1;
	for (const attachmentId of attachmentIds) {
		const owner = await db
			.selectFrom('attachment')
			.select('entry_id')
			.where('id', '=', attachmentId)
			.executeTakeFirstOrThrow();
		if (owner.entry_id !== version.entry_id)
			throw new Error(`attachment ${attachmentId} belongs to another entry`);
		await db
			.insertInto('entry_version_attachment')
			.values({
				entry_version_id: entryVersionId,
				attachment_id: attachmentId,
				position: position++
			})
			.onConflict((oc) => oc.columns(['entry_version_id', 'attachment_id']).doNothing())
			.execute();
	}
}

/** Removes an attachment from a version's list (not from versions that already list it). */
export async function unlistFromVersion(
	db: Kysely<Database>,
	entryVersionId: number,
	attachmentId: number
): Promise<void> {
	const version = await db
		.selectFrom('entry_version')
		.select('status')
		.where('id', '=', entryVersionId)
		.executeTakeFirstOrThrow();
	if (version.status === 'approved')
		throw new Error('an approved version is frozen: its attachment list never changes');
	await db
		.deleteFrom('entry_version_attachment')
		.where('entry_version_id', '=', entryVersionId)
		.where('attachment_id', '=', attachmentId)
		.execute();
}

// Moved below curation, which calls it (see the file); still part of this module's API.
export { carryForward } from '../catalogue/versionAttachments';

function attachmentQuery(db: Kysely<Database>) {
	return db
		.selectFrom('attachment as a')
		.innerJoin('attachment_blob as o', 'o.sha256', 'a.original_sha256')
		.leftJoin('attachment_blob as p', 'p.sha256', 'a.preview_sha256')
		.leftJoin('attachment_blob as t', 't.sha256', 'a.thumb_sha256')
		.leftJoin('attachment_blob as d', 'd.sha256', 'a.data_sha256')
		.select([
			'a.id',
			'a.entry_id',
			'a.kind',
			'a.role',
			'a.caption',
			'a.conditions',
			'a.file_name',
			'a.uploaded_by',
			'o.sha256',
			'o.media_type',
			'o.byte_size',
			'o.width',
			'o.height',
			'p.sha256 as p_sha256',
			'p.media_type as p_media_type',
			'p.width as p_width',
			'p.height as p_height',
			't.sha256 as t_sha256',
			't.media_type as t_media_type',
			't.width as t_width',
			't.height as t_height',
			'a.data_file_name',
			'd.sha256 as d_sha256',
			'd.byte_size as d_byte_size'
		]);
}

type AttachmentRow = Awaited<ReturnType<ReturnType<typeof attachmentQuery>['execute']>>[number];

function toDto(r: AttachmentRow): AttachmentDto {
	return {
		id: r.id,
		kind: r.kind,
		role: r.role,
		caption: r.caption,
		conditions: readJson(r.conditions),
		fileName: r.file_name,
		mediaType: r.media_type,
		byteSize: r.byte_size,
		sha256: r.sha256,
		width: r.width,
		height: r.height,
		preview: r.p_sha256
			? {
					sha256: r.p_sha256,
					mediaType: r.p_media_type ?? '',
					width: r.p_width,
					height: r.p_height
				}
			: null,
		thumbnail: r.t_sha256
			? {
					sha256: r.t_sha256,
					mediaType: r.t_media_type ?? '',
					width: r.t_width,
					height: r.t_height
				}
			: null,
		numbers:
			r.role === 'data'
				? { sha256: r.sha256, byteSize: r.byte_size, fileName: r.file_name }
				: r.d_sha256
					? {
							sha256: r.d_sha256,
							byteSize: r.d_byte_size ?? 0,
							fileName: r.data_file_name ?? 'numbers.txt'
						}
					: null
	};
}

async function attachmentsByIds(db: Kysely<Database>, ids: number[]): Promise<AttachmentDto[]> {
	if (ids.length === 0) return [];
	return (await attachmentQuery(db).where('a.id', 'in', ids).execute()).map(toDto);
}

/** A version's attachments, in their order. */
export async function attachmentsOfVersion(
	db: Kysely<Database>,
	entryVersionId: number
): Promise<AttachmentDto[]> {
	const rows = await attachmentQuery(db)
		.innerJoin('entry_version_attachment as l', 'l.attachment_id', 'a.id')
		.where('l.entry_version_id', '=', entryVersionId)
		.orderBy('l.position')
		.execute();
	return rows.map(toDto);
}

/**
 * The attachment behind a file URL, when `user` may see it: listed by an approved version of an
 * entry the reader may see (with everything it depends on), or by a version still under review
 * that the reader submitted or may curate. Null otherwise, whatever the reason — the same 404
 * for a missing and a hidden file, so a URL tells nothing about what it hides.
 */
export async function attachmentForReader(
	db: Kysely<Database>,
	attachmentId: number,
	user: SessionUser | null
): Promise<AttachmentDto | null> {
	const row = await attachmentQuery(db).where('a.id', '=', attachmentId).executeTakeFirst();
	if (!row) return null;
	const versions = await db
		.selectFrom('entry_version_attachment as l')
		.innerJoin('entry_version as v', 'v.id', 'l.entry_version_id')
		.innerJoin('entry as e', 'e.id', 'v.entry_id')
		.select(['v.status', 'v.created_by', 'e.accession'])
		.where('l.attachment_id', '=', attachmentId)
		.execute();
	const curator = user !== null && roleAtLeast(user.role, 'curator');
	for (const v of versions) {
		if (v.status === 'approved') {
			if (await findVisibleEntry(db, v.accession, user ? { groupIds: user.groupIds } : null))
				return toDto(row);
		} else if (v.status !== 'rejected' && v.status !== 'withdrawn') {
			if (curator || (user !== null && v.created_by === user.id)) return toDto(row);
		}
	}
	// Uploaded but not yet listed: only its uploader sees it (the form shows it before saving).
	if (versions.length === 0 && user !== null && row.uploaded_by === user.id) return toDto(row);
	return null;
}

/**
 * Removes attachments that no version can still show — listed by no version, or only by
 * rejected and withdrawn ones — once older than `graceMs` (an upload waiting for its form to be
 * saved is not an orphan yet), then every file no attachment names. Rows first, files after:
 * a crash in between leaves unnamed files, which the next run removes.
 */
export async function removeOrphans(
	db: Kysely<Database>,
	store: BlobStore,
	options: { now?: Date; graceMs?: number } = {}
): Promise<{ attachments: number; files: number }> {
	const cutoff = new Date(
		(options.now ?? new Date()).getTime() - (options.graceMs ?? 86_400_000)
	).toISOString();
	const orphans = await db
		.selectFrom('attachment as a')
		.select('a.id')
		.where('a.created_at', '<', cutoff)
		.where(({ not, exists, selectFrom }) =>
			not(
				exists(
					selectFrom('entry_version_attachment as l')
						.innerJoin('entry_version as v', 'v.id', 'l.entry_version_id')
						.select('l.attachment_id')
						.whereRef('l.attachment_id', '=', 'a.id')
						.where('v.status', 'not in', ['rejected', 'withdrawn'])
				)
			)
		)
		.execute();
	const ids = orphans.map((o) => o.id);
	const unnamed = await db.transaction().execute(async (trx) => {
		if (ids.length > 0) {
			await trx.deleteFrom('entry_version_attachment').where('attachment_id', 'in', ids).execute();
			await trx.deleteFrom('attachment').where('id', 'in', ids).execute();
		}
		const blobs = await trx
			.selectFrom('attachment_blob as b')
			.select('b.sha256')
			.where(({ not, exists, selectFrom }) =>
				not(
					exists(
						selectFrom('attachment as a')
							.select('a.id')
							.where((inner) =>
								inner.or([
									inner('a.original_sha256', '=', inner.ref('b.sha256')),
									inner('a.preview_sha256', '=', inner.ref('b.sha256')),
									inner('a.thumb_sha256', '=', inner.ref('b.sha256')),
									inner('a.data_sha256', '=', inner.ref('b.sha256'))
								])
							)
					)
				)
			)
			.execute();
		const keys = blobs.map((b) => b.sha256);
		if (keys.length > 0)
			await trx.deleteFrom('attachment_blob').where('sha256', 'in', keys).execute();
		return keys;
	});
	for (const key of unnamed) {
		// An upload of the same content may have named the file again since: keep it then.
		const named = await db
			.selectFrom('attachment_blob')
			.select('sha256')
			.where('sha256', '=', key)
			.executeTakeFirst();
		if (!named) await store.delete(key);
	}
	return { attachments: ids.length, files: unnamed.length };
}
