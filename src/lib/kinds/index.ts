import type { z } from 'zod';
import type { EntryKind } from '$lib/schemas/vocabulary';
import type { UploadKind } from '$lib/catalogue/uploadKinds';
import type { KindModule, KindUpload } from './kind';
import { centre } from './centre';
import { distance } from './distance';
import { potential } from './potential';
import { protein } from './protein';
import { source } from './source';
import { spinRecord } from './spinRecord';

/** Every kind of entry, by its identifier (ENTRY_KINDS in the vocabulary). */
export const KINDS = {
	protein,
	centre,
	potential,
	spin_record: spinRecord,
	distance,
	source
} satisfies {
	[K in EntryKind]: KindModule & (K extends UploadKind ? { upload: KindUpload } : unknown);
};

/** What one version of an entry of kind K stores. */
export type EntryDataByKind = { [K in EntryKind]: z.output<(typeof KINDS)[K]['schema']> };

export type { KindModule, KindUpload } from './kind';
export type { FormField, FormFieldType } from './formFields';
