import { KINDS, type EntryDataByKind, type EntryKind } from '$lib/kinds';

export type { EntryDataByKind } from '$lib/kinds';

export type EntryData = { [K in EntryKind]: { kind: K; data: EntryDataByKind[K] } }[EntryKind];

/** Validates a version's payload for its kind. @throws {z.ZodError} when it does not fit. */
export function parseEntryData(kind: EntryKind, value: unknown): EntryData {
	// The schema is the kind's own, so the data fits the kind: TypeScript cannot see that a
	// union's kind and data correspond (microsoft/TypeScript#30581).
	return { kind, data: KINDS[kind].schema.parse(value) } as EntryData;
}
