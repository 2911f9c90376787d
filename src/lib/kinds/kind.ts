import type { z } from 'zod';
import type { FieldErrors } from '$lib/schemas/searchParams';
import type { UploadColumn } from './csvColumns';
import type { FormField } from './formFields';

// What the browser and the server share about one kind of entry. Each kind has one module
// here (src/lib/kinds/<kind>.ts) and one on the server (src/lib/server/kinds/<kind>.ts); the
// table in index.ts names the kinds, and the server's table must then have every one of them.

export interface KindModule<
	Stored extends z.ZodType = z.ZodType,
	Input extends z.ZodType = z.ZodType
> {
	/** What the kind is called, in the singular ("Spin record"). */
	label: string;
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
	/**
	 * Fields naming other entries, and the kind each must name (index.ts checks that each is a
	 * kind).
	 */
	references: Readonly<Record<string, string>>;
	/** The fields a list of entries of this kind shows (a CSV batch's rows), in order. */
	listFields: readonly string[];
	/** A title a curator can scan in the queue, from the data as submitted. */
	submissionTitle(data: z.output<Stored>): string;
	/** CSV uploads of this kind: a kind with them is an upload kind (UPLOAD_KINDS). */
	upload?: KindUpload;
}

export interface KindUpload {
	/** What a file of this kind holds, for choosing one ("Spin records"). */
	label: string;
	/** One row of the file, in the plural, for titles and counts ("spin records"). */
	noun: string;
	/** The file's columns: the form's fields, and columns that name entries in words. */
	columns: readonly UploadColumn[];
	/**
	 * Fields a check computes from a column, shown in its preview right after that column
	 * (a potential's value vs SHE after the value as reported).
	 */
	derivedFields?: Readonly<Record<string, string>>;
}

/**
 * Declares a kind's module with its data typed from its schema; whether it has CSV uploads, and
 * the kinds its references name, stay in its type, so that the table of kinds can check them.
 */
export const defineKind = <
	Stored extends z.ZodType,
	Input extends z.ZodType = Stored,
	Upload extends KindUpload | undefined = undefined,
	const References extends Readonly<Record<string, string>> = Readonly<Record<string, string>>
>(
	module: KindModule<Stored, Input> & { upload?: Upload; references: References }
): DefinedKind<Stored, Input, Upload, References> =>
	module as DefinedKind<Stored, Input, Upload, References>;

type DefinedKind<Stored extends z.ZodType, Input extends z.ZodType, Upload, References> = Omit<
	KindModule<Stored, Input>,
	'upload' | 'references'
> & { upload: Upload; references: References };
