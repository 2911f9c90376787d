import { error, fail, redirect } from '@sveltejs/kit';
import { DomainError } from '$lib/domainError';
import { accessionField } from '$lib/schemas/fields';
import { visibilityFromForm } from '$lib/schemas/submission';
import { DISTANCE_METHODS, DISTANCE_METHOD_LABELS } from '$lib/schemas/vocabulary';
import { DEFAULT_CUTOFF_A } from '$lib/science';
import { requireRole } from '$lib/server/auth/guards';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { groupsForSharing } from '$lib/server/curation/formDefaults';
import { runCurationAction } from '$lib/server/curation/outbox';
import { toFormFailure } from '$lib/server/http/failures';
import { commitUpload } from '$lib/server/uploads/commitUpload';
import { planFromForm, proteinOr404, readUpload } from '$lib/server/structures/flow';
import { listOnSubmission } from '$lib/server/structures/structureFile';
import { CONFLICT_A } from '$lib/server/structures/structureDistances';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/*
 * Distances from a structure file, for contributors: upload (read), confirm the match (plan),
 * untick and submit (submit). The file is kept as the contributor's unlisted attachment; the next
 * steps post its id, and submitting lists it on every distance of the batch.
 */
const MULTIPART_OVERHEAD = 64 * 1024;

async function protein(event: RequestEvent | Parameters<PageServerLoad>[0]) {
	const user = requireRole(event, 'contributor');
	const accession = accessionField.safeParse(event.url.searchParams.get('protein'));
	if (!accession.success) error(400, 'Name the protein: ?protein=HL000123');
	try {
		return { user, protein: await proteinOr404(db, accession.data, user) };
	} catch (e) {
		if (e instanceof DomainError && e.code === 'not_found') error(404, e.message);
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	const { user, protein: p } = await protein(event);
	return {
		protein: { accession: p.accession, name: p.name, structureIds: p.structureIds },
		centres: p.centres.map((c) => ({
			accession: c.accession,
			label: c.label,
			kind: c.cofactorKind
		})),
		methods: DISTANCE_METHODS.map((m) => ({ value: m, label: DISTANCE_METHOD_LABELS[m] })),
		cutoffA: DEFAULT_CUTOFF_A,
		conflictA: CONFLICT_A,
		maxBytes: config.STRUCTURE_MAX_BYTES,
		groups: await groupsForSharing(db, user)
	};
};

async function formValues(event: RequestEvent) {
	const form = await event.request.formData();
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string' && k !== 'pair') values[k] = v;
	const pairs = form.getAll('pair').filter((v): v is string => typeof v === 'string');
	return { form, values, pairs };
}

export const actions: Actions = {
	/** Step 1: read the file, keep it, list its groups and propose a match. */
	read: async (event) => {
		const { user, protein: p } = await protein(event);
		const length = Number(event.request.headers.get('content-length') ?? 0);
		const limitMb = (config.STRUCTURE_MAX_BYTES / 1024 / 1024).toFixed(1);
		if (length > config.STRUCTURE_MAX_BYTES + MULTIPART_OVERHEAD)
			return fail(413, { errors: { file: [`the limit is ${limitMb} MB per structure file`] } });
		let form: FormData;
		try {
			form = await event.request.formData();
		} catch {
			return fail(400, { errors: { file: ['send the file as multipart/form-data'] } });
		}
		const file = form.get('file');
		if (!(file instanceof File) || file.size === 0)
			return fail(400, { errors: { file: ['choose a PDB or mmCIF file (.pdb, .cif, or .gz)'] } });
		try {
			const read = await readUpload(
				db,
				user,
				p,
				new Uint8Array(await file.arrayBuffer()),
				file.name
			);
			return {
				step: 'match' as const,
				attachment: read.file.attachmentId,
				sha256: read.file.sha256,
				filename: read.file.fileName,
				groups: read.reading.rows,
				proposals: read.reading.proposals
			};
		} catch (e) {
			return toFormFailure(e, event, {});
		}
	},
	/** Step 2: the confirmed match → distances within the cutoff, checked as a batch. */
	plan: async (event) => {
		const { user, protein: p } = await protein(event);
		const { values } = await formValues(event);
		let r;
		try {
			r = await planFromForm(db, user, p, values, null);
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		if (!r.ok) return fail(r.status, { values, errors: r.errors, groups: r.groups });
		return {
			step: 'pick' as const,
			values,
			attachment: r.file.attachmentId,
			sha256: r.file.sha256,
			filename: r.file.fileName,
			groups: r.reading.rows,
			matches: r.matches,
			proposed: r.plan.proposed
		};
	},
	/** Step 3: the ticked distances as one submission, all or none. */
	submit: async (event) => {
		const { user, protein: p } = await protein(event);
		const { values, pairs } = await formValues(event);
		if (pairs.length === 0)
			return fail(400, { values, errors: { form: ['tick at least one distance to submit'] } });
		let r;
		try {
			r = await planFromForm(db, user, p, values, new Set(pairs));
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		if (!r.ok) return fail(r.status, { values, errors: r.errors, groups: r.groups });
		const visibility = visibilityFromForm(values);
		if (!visibility.ok) return fail(400, { values, errors: visibility.fields });
		if (r.plan.check.errorCount > 0)
			return fail(400, {
				values,
				errors: {
					form: [`Nothing was submitted: ${r.plan.check.errorCount} distance(s) have errors.`]
				}
			});
		let result;
		try {
			result = await runCurationAction(db, async (trx) => {
				const committed = await commitUpload(trx, user, r.plan.check, {
					filename: r.file.fileName,
					visibility: visibility.visibility,
					changeNote: null,
					origin: event.url.origin,
					pendingRowsMax: config.PENDING_ROWS_MAX,
					title: `${r.plan.check.entries.length} distance(s) of ${p.name} from structure ${r.form.structureId} (${r.file.fileName})`
				});
				// Each distance's evidence: the file it was measured in, in the same transaction.
				await listOnSubmission(trx, r.file, committed.submissionId, r.form.structureId);
				return committed;
			});
		} catch (e) {
			return toFormFailure(e, event, values);
		}
		redirect(303, `/submissions/${result.submissionId}?uploaded`);
	}
};
