import type { Kysely } from 'kysely';
import { DomainError } from '$lib/domainError';
import { fieldErrors } from '$lib/schemas/fieldErrors';
import type { FieldErrors } from '$lib/schemas/searchParams';
import { structurePlanSchema, type StructurePlanForm } from '$lib/schemas/structureDistances';
import type { SessionUser } from '../auth/roles';
import { config } from '../config';
import type { Database } from '../db/schema';
import { readStructureFile } from './readStructureFile';
import { cachedReading, rememberReading } from './readingCache';
import {
	keepStructureFile,
	ownStructureFile,
	structureBytes,
	type StructureFileRef
} from './structureFile';
import {
	loadProteinForStructure,
	planDistances,
	type DistancePlan,
	type ProteinForStructure
} from './structureDistances';
import type { StructureReading } from '$lib/science';
import { calculate } from '../calc/compute';

/*
 * The three steps of distances from a structure, as services the route calls: read the upload
 * (keep it as an unlisted attachment, list the groups, propose a match), plan the distances from
 * a confirmed match, and (in the route) commit the ticked ones through the CSV batch commit and
 * list the file on every distance of the batch (structureFile.ts).
 */
export const structureLimits = () => ({
	maxBytes: config.STRUCTURE_MAX_BYTES,
	maxTextBytes: config.STRUCTURE_MAX_TEXT_BYTES
});

export async function proteinOr404(
	db: Kysely<Database>,
	accession: string,
	user: SessionUser
): Promise<ProteinForStructure> {
	const protein = await loadProteinForStructure(db, accession, { groupIds: user.groupIds });
	// The same answer for a hidden protein as for none: its existence is not revealed.
	if (!protein) throw new DomainError('not_found', `no protein ${accession}`);
	return protein;
}

/** Another structure file is being read: 503 with Retry-After, nothing read or stored. */
export class StructureBusyError extends DomainError {
	declare readonly retryAfterSeconds: number;

	constructor() {
		super('unavailable', 'Another structure file is being read; try again in a few seconds.', {
			retryAfterSeconds: 5
		});
		this.name = 'StructureBusyError';
	}
}

/*
 * Structure files read at once in this process. Each read holds the stored bytes, their text (up
 * to STRUCTURE_MAX_TEXT_BYTES) and the copy sent to the worker in memory: one at a time keeps a
 * crowd of uploads and "Measure" clicks from running the server out of memory; the others are
 * refused at once with a 503 before anything is read.
 */
const READS_AT_ONCE = 1;
let readsRunning = 0;

async function oneReadAtATime<T>(work: () => Promise<T>): Promise<T> {
	if (readsRunning >= READS_AT_ONCE) throw new StructureBusyError();
	readsRunning++;
	try {
		return await work();
	} finally {
		readsRunning--;
	}
}

/**
 * The groups and proposed match, read in the calculation worker pool (its time and memory
 * limits apply): parsing a large file must not hold up other requests. A file it cannot use
 * comes back as a 400 on the file field (CalcInputError) with the reader's reason.
 */
async function readGroupsOffThread(
	text: string,
	protein: ProteinForStructure
): Promise<StructureReading> {
	return calculate({ kind: 'structure', text, centres: protein.centres }, null);
}

export interface ReadResult {
	/** The kept file: its attachment id is what the next steps post. */
	file: StructureFileRef;
	gzipped: boolean;
	reading: StructureReading;
}

/** Reads and checks an uploaded file, keeps it as an attachment; the groups and a proposed match. */
export async function readUpload(
	db: Kysely<Database>,
	user: Pick<SessionUser, 'id'>,
	protein: ProteinForStructure,
	bytes: Uint8Array,
	filename: string
): Promise<ReadResult> {
	const { file, reading } = await oneReadAtATime(async () => {
		const file = await readStructureFile(bytes, structureLimits());
		return { file, reading: await readGroupsOffThread(file.text, protein) };
	});
	const kept = await keepStructureFile(db, {
		entryId: protein.entryId,
		bytes,
		fileName: filename,
		uploadedBy: user.id
	});
	rememberReading(kept.attachmentId, reading);
	return { file: kept, gzipped: file.gzipped, reading };
}

/**
 * The groups of a kept file: from the cache when this process read it lately, otherwise read
 * again from the store in the worker pool. Null when the store no longer has the bytes.
 */
async function readingOf(
	file: StructureFileRef,
	protein: ProteinForStructure
): Promise<StructureReading | null> {
	const cached = cachedReading(file.attachmentId);
	if (cached) return cached;
	const reading = await oneReadAtATime(async () => {
		const bytes = await structureBytes(file);
		if (!bytes) return null;
		const text = await readStructureFile(bytes, structureLimits());
		return readGroupsOffThread(text.text, protein);
	});
	if (reading) rememberReading(file.attachmentId, reading);
	return reading;
}

export type PlanResult =
	| {
			ok: true;
			form: StructurePlanForm;
			file: StructureFileRef;
			reading: StructureReading;
			matches: string[];
			plan: DistancePlan;
	  }
	| { ok: false; status: 400 | 404; errors: FieldErrors; groups?: StructureReading['rows'] };

/** Plans the distances from the posted form: the stored file, the confirmed match, the cutoff. */
export async function planFromForm(
	db: Kysely<Database>,
	user: SessionUser,
	protein: ProteinForStructure,
	values: Record<string, string>,
	only: Set<string> | null
): Promise<PlanResult> {
	const parsed = structurePlanSchema.safeParse(values);
	if (!parsed.success) return { ok: false, status: 400, errors: fieldErrors(parsed.error) };
	const form = parsed.data;
	// Only the user's own unlisted file of this protein; any other id gets the answer a missing
	// file gets, so an id tells nothing about someone else's upload.
	const file = await ownStructureFile(db, form.attachment, user, protein.entryId);
	const reading = file ? await readingOf(file, protein) : null;
	if (!file || !reading)
		return {
			ok: false,
			status: 404,
			errors: { file: ['the structure file is no longer kept: upload it again'] }
		};
	const visible = new Set(protein.centres.map((c) => c.accession));
	const errors: FieldErrors = {};
	const used = new Map<string, number>();
	const matches = reading.groups.map((_, i) => {
		const value = (values[`match.${i}`] ?? '').trim();
		if (value === '') return '';
		if (!visible.has(value)) {
			// Hidden and unknown centres get the same message.
			errors[`match.${i}`] = [`${value} is not a centre of ${protein.name}`];
			return '';
		}
		const earlier = used.get(value);
		if (earlier !== undefined) {
			errors[`match.${i}`] = [`this centre is already matched to ${reading.rows[earlier]!.label}`];
			return '';
		}
		used.set(value, i);
		return value;
	});
	if (Object.keys(errors).length > 0)
		return { ok: false, status: 400, errors, groups: reading.rows };
	if (used.size < 2)
		return {
			ok: false,
			status: 400,
			errors: { form: ['match at least two groups to centres'] },
			groups: reading.rows
		};
	const plan = await planDistances(db, {
		reading,
		protein,
		matches,
		structureId: form.structureId,
		method: form.method,
		cutoffA: form.cutoffA,
		sha256: file.sha256,
		filename: file.fileName,
		only,
		viewer: { groupIds: user.groupIds },
		uploaderId: user.id
	});
	return { ok: true, form, file, reading, matches, plan };
}
