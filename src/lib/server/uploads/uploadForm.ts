import { z } from 'zod';
import { UPLOAD_KINDS, type UploadKind } from '$lib/kinds';
import { addFieldErrors, fieldErrors } from '$lib/schemas/fieldErrors';
import type { FieldErrors } from '$lib/schemas/searchParams';
import {
	submissionMetaSchema,
	visibilityFromForm,
	type VisibilityRequest
} from '$lib/schemas/submission';
import { config } from '../config';
import { uploadLimitMessage, uploadTooLargeMessage } from '../requestLimits';

/*
 * Reads the upload form (kind, file, visibility, note) and the file's text. Size is checked from
 * the request's length before the body is read, and again on the file itself.
 */
export type UploadForm =
	| {
			ok: true;
			kind: UploadKind;
			filename: string;
			text: string;
			visibility: VisibilityRequest;
			changeNote: string | null;
			values: Record<string, string>;
	  }
	| { ok: false; status: 400 | 413; values: Record<string, string>; errors: FieldErrors };

/** The kind of rows a file holds (the form's and the check API's `kind` field). */
export const uploadKindField = z.enum(UPLOAD_KINDS, {
	error: `expected one of ${UPLOAD_KINDS.join(', ')}`
});

/** The query of POST /api/v1/uploads/check: the answer as JSON or as a CSV report. */
export const uploadCheckQuerySchema = z.strictObject({
	format: z.enum(['json', 'csv'], { error: 'expected json or csv' }).default('json')
});

export async function readUploadForm(request: Request): Promise<UploadForm> {
	const tooLarge = uploadTooLargeMessage(Number(request.headers.get('content-length') ?? 0));
	if (tooLarge) return { ok: false, status: 413, values: {}, errors: { file: [tooLarge] } };
	const type = request.headers.get('content-type') ?? '';
	if (!type.startsWith('multipart/form-data')) {
		return {
			ok: false,
			status: 400,
			values: {},
			errors: { file: ['send the file as multipart/form-data (fields kind and file)'] }
		};
	}
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		return {
			ok: false,
			status: 400,
			values: {},
			errors: { file: ['the multipart body could not be read'] }
		};
	}
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	const errors: FieldErrors = {};
	const kind = uploadKindField.safeParse(values.kind);
	if (!kind.success) Object.assign(errors, fieldErrors(kind.error, { root: 'kind' }));
	const file = form.get('file');
	if (!(file instanceof File) || file.size === 0) errors.file = ['choose a CSV file'];
	else if (file.size > config.UPLOAD_MAX_BYTES)
		return { ok: false, status: 413, values, errors: { file: [uploadLimitMessage(file.size)] } };
	const visibility = visibilityFromForm(values);
	if (!visibility.ok) addFieldErrors(errors, visibility.fields);
	const meta = submissionMetaSchema.safeParse({ changeNote: values.changeNote ?? '' });
	if (!meta.success) Object.assign(errors, fieldErrors(meta.error));
	if (
		!kind.success ||
		!(file instanceof File) ||
		file.size === 0 ||
		!visibility.ok ||
		!meta.success
	) {
		return { ok: false, status: 400, values, errors };
	}
	return {
		ok: true,
		kind: kind.data,
		filename: file.name || 'upload.csv',
		text: await file.text(),
		visibility: visibility.visibility,
		changeNote: meta.data.changeNote,
		values
	};
}
