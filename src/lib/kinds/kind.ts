import type { z } from 'zod';
import type { FieldErrors } from '$lib/schemas/searchParams';
import type { EntryKind } from '$lib/schemas/vocabulary';
import type { UploadColumn } from './csvColumns';
import type { FormField } from './formFields';

// What the browser and the server share about one kind of entry. Each kind has one module
// here (src/lib/kinds/<kind>.ts) and one on the server (src/lib/server/kinds/<kind>.ts); the
// tables in the two index.ts files list them, typed so that a kind left out is a type error.

export interface KindModule<
	Stored extends z.ZodType = z.ZodType,
	Input extends z.ZodType = z.ZodType
> {
	/** What one version of an entry of this kind stores. */
	schema: Stored;
	/**
	 * What a contributor sends, where it differs from what is stored (a potential is sent as
	 * reported and stored normalised as well), and how the one becomes the other — or why it
	 * cannot, by field of the input.
	 */
	input?: {
		schema: Input;
		toData(
			input: z.output<Input>
		): { ok: true; data: z.output<Stored> } | { ok: false; fields: FieldErrors };
	};
	/** The form's fields, in order; CSV columns are built from them. */
	formFields: readonly FormField[];
	/** Fields naming other entries, and the kind each must name. */
	references: Readonly<Record<string, EntryKind>>;
	/** A title a curator can scan in the queue, from the data as submitted. */
	submissionTitle(data: z.output<Stored>): string;
	/** CSV uploads of this kind (the kinds in UPLOAD_KINDS have them). */
	upload?: KindUpload;
}

export interface KindUpload {
	/** The file's columns: the form's fields, and columns that name entries in words. */
	columns: readonly UploadColumn[];
}

/**
 * Declares a kind's module with its data typed from its schema; whether it has CSV uploads
 * stays in its type, so that the table of kinds can require them of the upload kinds.
 */
export const defineKind = <
	Stored extends z.ZodType,
	Input extends z.ZodType = Stored,
	Upload extends KindUpload | undefined = undefined
>(
	module: KindModule<Stored, Input> & { upload?: Upload }
): KindModule<Stored, Input> & { upload: Upload } =>
	module as KindModule<Stored, Input> & { upload: Upload };
