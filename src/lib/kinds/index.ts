import type { z } from 'zod';
import { FIELD_LABELS, formatField } from '$lib/catalogue/fields';
import type { FormField } from './formFields';
import type { KindModule, KindUpload } from './kind';
import { centre } from './centre';
import { distance } from './distance';
import { potential } from './potential';
import { protein } from './protein';
import { source } from './source';
import { spinRecord } from './spinRecord';

/**
 * Every kind of entry, by its identifier: the one list of them. The identifier is stored in
 * `entry.kind`, names the kind's read-model table, and appears in URLs and the API.
 */
export const KINDS = {
	protein,
	centre,
	potential,
	spin_record: spinRecord,
	distance,
	source
} satisfies Record<string, KindModule>;

export type EntryKind = keyof typeof KINDS;

export const ENTRY_KINDS = Object.keys(KINDS) as [EntryKind, ...EntryKind[]];

export const isEntryKind = (value: string): value is EntryKind => Object.hasOwn(KINDS, value);

export const ENTRY_KIND_LABELS = Object.fromEntries(
	ENTRY_KINDS.map((kind) => [kind, KINDS[kind].label])
) as Record<EntryKind, string>;

// A reference field must name a kind; checked here because a kind's module cannot name the
// table of kinds it is part of.
KINDS satisfies Record<EntryKind, { references: Readonly<Record<string, EntryKind>> }>;

/** The fields of a kind's data that name other entries, and the kind each must name. */
export function referencesOf(kind: EntryKind): Readonly<Record<string, EntryKind>> {
	// Checked to name kinds just above.
	return KINDS[kind].references;
}

/** The kinds that can be uploaded as CSV files: those whose module says how. */
export type UploadKind = {
	[K in EntryKind]: (typeof KINDS)[K]['upload'] extends KindUpload ? K : never;
}[EntryKind];

export const UPLOAD_KINDS = ENTRY_KINDS.filter((kind) => KINDS[kind].upload) as [
	UploadKind,
	...UploadKind[]
];

export const UPLOAD_KIND_LABELS = Object.fromEntries(
	UPLOAD_KINDS.map((kind) => [kind, KINDS[kind].upload.label])
) as Record<UploadKind, string>;

/** What one row of each kind of file is, in the plural, for titles and counts. */
export const UPLOAD_KIND_NOUNS = Object.fromEntries(
	UPLOAD_KINDS.map((kind) => [kind, KINDS[kind].upload.noun])
) as Record<UploadKind, string>;

const formField = (kind: EntryKind, field: string) =>
	(KINDS[kind].formFields as readonly FormField[]).find((f) => f.name === field);

/** What a field of a kind's data is called: the kind's own label, else the shared one. */
export function fieldLabel(kind: EntryKind, field: string): string {
	return formField(kind, field)?.label ?? FIELD_LABELS[field] ?? field;
}

/**
 * A field of a kind's data as text: a choice by the label its form gives it, and a number the
 * shared formatter does not know with the unit its form gives it.
 */
export function formatKindField(kind: EntryKind, field: string, value: unknown): string {
	const form = formField(kind, field);
	const option = form?.options?.find((o) => o.value === value);
	return option ? option.label : formatField(field, value, form?.unit);
}

/** What one version of an entry of kind K stores. */
export type EntryDataByKind = { [K in EntryKind]: z.output<(typeof KINDS)[K]['schema']> };

export type { KindModule, KindUpload } from './kind';
export type { FormField, FormFieldType } from './formFields';
