import type { EntryKind } from '$lib/schemas/vocabulary';
import type { ServerKindModule } from './kind';
import { centre } from './centre';
import { distance } from './distance';
import { potential } from './potential';
import { protein } from './protein';
import { source } from './source';
import { spinRecord } from './spinRecord';

/** The server's part of every kind of entry (the shared part: src/lib/kinds). */
export const SERVER_KINDS = {
	protein,
	centre,
	potential,
	spin_record: spinRecord,
	distance,
	source
} satisfies { [K in EntryKind]: ServerKindModule<K> };

/**
 * The server module of a kind, for data of that kind held in a union (EntryData): TypeScript
 * cannot see that a union's kind and data correspond (microsoft/TypeScript#30581), so the
 * correspondence is asserted here, once.
 */
export function serverKind(kind: EntryKind): ServerKindModule<EntryKind> {
	return SERVER_KINDS[kind] as unknown as ServerKindModule<EntryKind>;
}

export type { ApprovedVersion, Dependency, PotentialRowsColumn, ServerKindModule } from './kind';
