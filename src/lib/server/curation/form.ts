import { readEntryForm } from '$lib/catalogue/entryForm';
import type { EntryData } from '$lib/schemas/entryData';
import { addFieldErrors, fieldErrors } from '$lib/schemas/fieldErrors';
import type { FieldErrors } from '$lib/schemas/searchParams';
import {
	parseEntryInput,
	submissionMetaSchema,
	visibilityFromForm,
	type VisibilityRequest
} from '$lib/schemas/submission';
import type { EntryKind } from '$lib/kinds';

/*
 * Reads an entry form post: the entry data through the kind's zod schema, the visibility it
 * asks for and the note to curators. Every problem comes back at once, by field.
 */
export type SubmissionForm =
	| {
			ok: true;
			entry: EntryData;
			visibility: VisibilityRequest;
			changeNote: string | null;
			values: Record<string, string>;
	  }
	| { ok: false; values: Record<string, string>; errors: FieldErrors };

export function readSubmissionForm(kind: EntryKind, form: FormData): SubmissionForm {
	const values: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') values[k] = v;
	const reading = readEntryForm(kind, values);
	const errors: FieldErrors = { ...reading.errors };
	const parsed = parseEntryInput(kind, reading.value);
	if (!parsed.ok) {
		for (const [field, messages] of Object.entries(parsed.fields)) {
			// A field the reader already named keeps the reader's clearer message.
			if (!errors[field]) errors[field] = messages;
		}
	}
	const visibility = visibilityFromForm(values);
	if (!visibility.ok) addFieldErrors(errors, visibility.fields);
	const meta = submissionMetaSchema.safeParse({ changeNote: values.changeNote ?? '' });
	if (!meta.success) Object.assign(errors, fieldErrors(meta.error));
	if (Object.keys(errors).length > 0 || !parsed.ok || !visibility.ok || !meta.success) {
		return { ok: false, values, errors };
	}
	return {
		ok: true,
		entry: parsed.entry,
		visibility: visibility.visibility,
		changeNote: meta.data.changeNote,
		values
	};
}
