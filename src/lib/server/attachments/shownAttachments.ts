import type { Kysely } from 'kysely';
import {
	ATTACHMENT_KIND_LABELS,
	attachmentConditionsSchema,
	type AttachmentConditions
} from '$lib/schemas/attachment';
import { LRUCache } from 'lru-cache';
import { readSpectrumData, type SpectrumAxis, type SpectrumData } from '$lib/schemas/spectrumData';
import { conditionWords, formatByteSize } from '$lib/format/attachments';
import { thinnedIndices, type SpectrumConditions } from '$lib/components/spectrumPlot';
import type { AttachmentAnswer } from '$lib/schemas/attachmentResponse';
import type { Database } from '../db/schema';
import { attachmentAnswer, attachmentUrls, type AttachmentUrls } from './attachmentAnswer';
import { attachmentsOfVersion, numbersAxis, type AttachmentDto } from './attachments';
import type { BlobStore } from './storage';

/*
 * A version's attachments as pages show them (the entry page, the curator's review): words for
 * the kind and the conditions, the file URLs, and for a spectrum with numbers the points to plot
 * (read from the store, bounded by readSpectrumData: 1 MB, 20 000 points; thinned for drawing).
 * The list is the version's own (attachmentsOfVersion), so an approved version's never changes.
 */

/** Most points handed to a plot: enough to zoom into a sweep, peaks kept (thinnedIndices). */
export const PLOTTED_POINTS_MAX = 4000;

export interface ShownAttachment {
	id: number;
	kind: AttachmentDto['kind'];
	kindLabel: string;
	role: AttachmentDto['role'];
	caption: string;
	/** The acquisition conditions stated, with units, in the order they are read. */
	conditions: { label: string; text: string }[];
	fileName: string;
	mediaType: string;
	/** "19 kB". */
	size: string;
	thumbnail: { width: number | null; height: number | null } | null;
	urls: AttachmentUrls;
	/** The numbers to plot, or why they are not plotted; null when there are none. */
	plot:
		| {
				data: SpectrumData;
				conditions: SpectrumConditions;
				/** "Drawn from 4 000 of 18 000 points …" when thinned. */
				note: string | null;
		  }
		| { problem: string }
		| null;
}

/** The conditions as stored (checked by the schema on upload; none if that ever fails). */
function storedConditions(a: AttachmentDto): Partial<AttachmentConditions> {
	const parsed = attachmentConditionsSchema.safeParse(a.conditions);
	return parsed.success ? parsed.data : {};
}

/** What the plot converts the x axis with: the frequency (g axis), the electrode (SHE axis). */
function plotConditions(a: AttachmentDto): SpectrumConditions {
	const c = storedConditions(a);
	return {
		kind: a.kind === 'epr_spectrum' ? 'epr' : a.kind === 'voltammogram' ? 'voltammogram' : 'other',
		frequencyGHz: c.microwaveFrequencyGHz ?? null,
		electrode: c.referenceElectrode ?? null,
		temperatureK: c.temperatureK ?? null
	};
}

/** The numbers of an attachment, read from the store and thinned for drawing. */
/**
 * Readings of numbers files, thinned for drawing, by file SHA-256 and axis. A file never
 * changes under its SHA-256, so an entry can be re-rendered (signed-in readers and query
 * strings skip the page cache) without reading and parsing its files again. Bounded by points.
 */
const readings = new LRUCache<string, { data: SpectrumData; total: number } | { problem: string }>({
	maxSize: 30 * PLOTTED_POINTS_MAX,
	sizeCalculation: (r) => ('data' in r ? Math.max(1, r.data.points.length) : 1)
});

async function readingOf(
	store: BlobStore,
	sha256: string,
	axis: SpectrumAxis
): Promise<{ data: SpectrumData; total: number } | { problem: string }> {
	const key = `${sha256}:${axis}`;
	const cached = readings.get(key);
	if (cached) return cached;
	const bytes = await store.get(sha256);
	// Not cached: the file may be restored to the store.
	if (!bytes) return { problem: 'The numbers file is missing from the file store.' };
	const reading = readSpectrumData(bytes, { xAxis: axis });
	// Checked on upload; a file the reader now refuses (a stricter rule) is said so, not drawn.
	const result = reading.ok
		? {
				data: { ...reading.data, points: thinned(reading.data.points) },
				total: reading.data.points.length
			}
		: { problem: `The numbers cannot be plotted: ${reading.problems[0]}.` };
	readings.set(key, result);
	return result;
}

function thinned(all: [number, number][]): [number, number][] {
	return all.length > PLOTTED_POINTS_MAX
		? thinnedIndices(
				all.map((p) => p[1]),
				PLOTTED_POINTS_MAX
			).map((i) => all[i] as [number, number])
		: all;
}

async function plotOf(store: BlobStore, a: AttachmentDto): Promise<ShownAttachment['plot']> {
	if (!a.numbers || a.role === 'structure') return null;
	const reading = await readingOf(store, a.numbers.sha256, numbersAxis(a.kind));
	if ('problem' in reading) return reading;
	const kept = reading.data.points.length;
	return {
		data: reading.data,
		conditions: plotConditions(a),
		note:
			kept < reading.total
				? `Drawn from ${kept} of the file's ${reading.total} points (the highest and lowest of each run kept); the data file has them all.`
				: null
	};
}

/** One attachment as a page shows it. */
export async function showAttachment(store: BlobStore, a: AttachmentDto): Promise<ShownAttachment> {
	return {
		id: a.id,
		kind: a.kind,
		kindLabel: ATTACHMENT_KIND_LABELS[a.kind],
		role: a.role,
		caption: a.caption,
		conditions: conditionWords(storedConditions(a)),
		fileName: a.fileName,
		mediaType: a.mediaType,
		size: formatByteSize(a.byteSize),
		thumbnail: a.thumbnail ? { width: a.thumbnail.width, height: a.thumbnail.height } : null,
		urls: attachmentUrls(a),
		plot: await plotOf(store, a)
	};
}

/** A version's attachments as a page shows them, in the version's order. */
export async function shownAttachmentsOfVersion(
	db: Kysely<Database>,
	store: BlobStore,
	entryVersionId: number
): Promise<ShownAttachment[]> {
	const list = await attachmentsOfVersion(db, entryVersionId);
	return Promise.all(list.map((a) => showAttachment(store, a)));
}

/**
 * The row id of an approved version of an entry (by accession and number), or null. For entries
 * the caller has already found visible to the reader (getEntryView).
 */
export async function approvedVersionId(
	db: Kysely<Database>,
	accession: string,
	version: number
): Promise<number | null> {
	const row = await db
		.selectFrom('entry_version as v')
		.innerJoin('entry as e', 'e.id', 'v.entry_id')
		.select('v.id')
		.where('e.accession', '=', accession)
		.where('v.version', '=', version)
		.where('v.status', '=', 'approved')
		.executeTakeFirst();
	return row?.id ?? null;
}

/** The attachments of an approved version, as the entry API lists them (none: an empty list). */
export async function apiAttachmentsOfVersion(
	db: Kysely<Database>,
	accession: string,
	version: number,
	base: URL
): Promise<AttachmentAnswer[]> {
	const id = await approvedVersionId(db, accession, version);
	if (id === null) return [];
	return (await attachmentsOfVersion(db, id)).map((a) => attachmentAnswer(a, base));
}
