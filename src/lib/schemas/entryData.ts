import type { z } from 'zod';
import { centreSchema, type Centre } from './centre';
import { distanceSchema, type Distance } from './distance';
import { potentialSchema, type Potential } from './potential';
import { proteinSchema, type Protein } from './protein';
import { sourceSchema, type Source } from './source';
import { spinRecordSchema, type SpinRecord } from './spinRecord';
import type { EntryKind } from './vocabulary';

/** What one version of each kind of entry holds: the schema a version's JSON must satisfy. */
export const ENTRY_DATA_SCHEMAS = {
	protein: proteinSchema,
	centre: centreSchema,
	potential: potentialSchema,
	spin_record: spinRecordSchema,
	distance: distanceSchema,
	source: sourceSchema
} satisfies Record<EntryKind, z.ZodType>;

export interface EntryDataByKind {
	protein: Protein;
	centre: Centre;
	potential: Potential;
	spin_record: SpinRecord;
	distance: Distance;
	source: Source;
}

export type EntryData = { [K in EntryKind]: { kind: K; data: EntryDataByKind[K] } }[EntryKind];

/** Validates a version's payload for its kind. @throws {z.ZodError} when it does not fit. */
export function parseEntryData(kind: EntryKind, value: unknown): EntryData {
	switch (kind) {
		case 'protein':
			return { kind, data: proteinSchema.parse(value) };
		case 'centre':
			return { kind, data: centreSchema.parse(value) };
		case 'potential':
			return { kind, data: potentialSchema.parse(value) };
		case 'spin_record':
			return { kind, data: spinRecordSchema.parse(value) };
		case 'distance':
			return { kind, data: distanceSchema.parse(value) };
		case 'source':
			return { kind, data: sourceSchema.parse(value) };
	}
}
