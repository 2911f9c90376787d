import { ENTRY_KINDS, ENTRY_KIND_LABELS, type EntryKind, type UploadKind } from '$lib/kinds';
import type { KindOnServer, ServerKindModule, UploadRules } from './kind';
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
} satisfies { [K in EntryKind]: KindOnServer<K> };

/**
 * The server module of a kind, for data of that kind held in a union (EntryData): TypeScript
 * cannot see that a union's kind and data correspond (microsoft/TypeScript#30581), so the
 * correspondence is asserted here, once.
 */
/**
 * The kinds with their labels, for pages that offer a choice of kind: sent with the page's data
 * so that the page does not ship the table of kinds (and the schemas in it) to the browser.
 */
export function kindChoices(): { kind: EntryKind; label: string }[] {
	return ENTRY_KINDS.map((kind) => ({ kind, label: ENTRY_KIND_LABELS[kind] }));
}

export function serverKind(kind: EntryKind): ServerKindModule<EntryKind> {
	return SERVER_KINDS[kind] as unknown as ServerKindModule<EntryKind>;
}

/**
 * The title of one version of an entry of `kind` (see ServerKindModule.title): `refs` holds the
 * data of the versions its reference fields are pinned to, by field.
 */
export function versionTitle(
	kind: EntryKind,
	data: Record<string, unknown>,
	refs: Readonly<Record<string, Record<string, unknown>>>
): string {
	// As in serverKind: data and pinned references were stored for this kind and its fields.
	return serverKind(kind).title(data as never, refs as never);
}

/** The CSV rules of an upload kind. */
export function uploadRules(kind: UploadKind): UploadRules<EntryKind> {
	// As in serverKind: the rules are the kind's own.
	return SERVER_KINDS[kind].upload as unknown as UploadRules<EntryKind>;
}

export type {
	ApprovedVersion,
	Dependency,
	PinnedData,
	PotentialRowsColumn,
	ServerKindModule,
	UploadRules
} from './kind';
