import { sql, type Kysely } from 'kysely';

/**
 * The warnings stored with a CSV row's version (`entry_version.warnings`, migration 0003) were a
 * JSON list of English sentences, counted by the review queue with `LIKE '%typical range%'`.
 * They become a JSON list of objects `{ kind, field, message, source?, accession? }`, counted by
 * kind. Each sentence is read as the upload checks wrote it:
 *
 * - "… the typical range for … (range source: S)" → range, with its source S apart;
 * - "conflicts with approved HL…: …" → conflict with that accession;
 * - "already in the registry as HL…" → duplicate of that accession;
 * - anything else → other, kept as written.
 *
 * The field is the column the check reported it on: the reported value for ranges and
 * conflicts, and for duplicates the column each kind reported them on.
 */

/** The column each kind's duplicate check reported on (frozen: as the checks were at 0006). */
const DUPLICATE_FIELD: Record<string, string> = {
	potential: 'reportedValue',
	spin_record: 'oxidationLevel',
	distance: 'structureId',
	centre: 'label'
};

const PAGE = 1000;

interface Warning {
	kind: 'range' | 'conflict' | 'duplicate' | 'other';
	field: string;
	message: string;
	source?: string;
	accession?: string;
}

const RANGE_WITH_SOURCE = /^([\s\S]*) \(range source: ([\s\S]*)\)$/;
const CONFLICT = /^conflicts with approved (HL\d+): /;
const DUPLICATE = /^already in the registry as (HL\d+)$/;

export function classifyWarningText(text: string, entryKind: string): Warning {
	const ranged = RANGE_WITH_SOURCE.exec(text);
	if (ranged) {
		return {
			kind: 'range',
			field: 'reportedValue',
			message: ranged[1] as string,
			source: ranged[2] as string
		};
	}
	if (/typical range/i.test(text)) return { kind: 'range', field: 'reportedValue', message: text };
	const conflict = CONFLICT.exec(text);
	if (conflict) {
		return {
			kind: 'conflict',
			field: 'reportedValue',
			message: text,
			accession: conflict[1] as string
		};
	}
	const duplicate = DUPLICATE.exec(text);
	if (duplicate) {
		return {
			kind: 'duplicate',
			field: DUPLICATE_FIELD[entryKind] ?? '',
			message: text,
			accession: duplicate[1] as string
		};
	}
	return { kind: 'other', field: '', message: text };
}

/** The stored text of one version's warnings, rewritten; null when there is nothing to keep. */
function convert(stored: string, entryKind: string): string | null {
	let list: unknown;
	try {
		list = JSON.parse(stored);
	} catch {
		// Not JSON at all: the whole text is one warning.
		return JSON.stringify([classifyWarningText(stored, entryKind)]);
	}
	const items = Array.isArray(list) ? list : [list];
	const warnings = items.map((item): Warning => {
		if (typeof item === 'string') return classifyWarningText(item, entryKind);
		const o = item as Partial<Warning> | null;
		if (o && typeof o === 'object' && typeof o.kind === 'string' && typeof o.message === 'string')
			return { ...o, field: typeof o.field === 'string' ? o.field : '' } as Warning;
		return classifyWarningText(JSON.stringify(item), entryKind);
	});
	return warnings.length ? JSON.stringify(warnings) : null;
}

/**
 * Rewrites every stored list of warnings with `change`, in one transaction. Approved versions
 * are frozen by a trigger (migration 0001) because their data must never change; their warnings
 * change representation here, not meaning, so the trigger is lifted for this transaction only
 * and put back as it was. Run again after a crash, it finds lists already converted and keeps
 * them.
 */
async function rewrite(
	db: Kysely<any>,
	change: (stored: string, entryKind: string) => string | null
): Promise<void> {
	await db.transaction().execute(async (trx) => {
		await sql`drop trigger entry_version_approved_is_immutable`.execute(trx);
		await rewriteAll(trx, change);
		await sql`create trigger entry_version_approved_is_immutable
		before update on entry_version
		when old.status = 'approved'
		begin
			select raise(abort, 'approved entry versions are immutable');
		end`.execute(trx);
	});
}

async function rewriteAll(
	db: Kysely<any>,
	change: (stored: string, entryKind: string) => string | null
): Promise<void> {
	let after = 0;
	for (;;) {
		const rows: { id: number; warnings: string; kind: string }[] = await db
			.selectFrom('entry_version')
			.innerJoin('entry', 'entry.id', 'entry_version.entry_id')
			.select(['entry_version.id', 'entry_version.warnings', 'entry.kind'])
			.where('entry_version.warnings', 'is not', null)
			.where('entry_version.id', '>', after)
			.orderBy('entry_version.id')
			.limit(PAGE)
			.execute();
		if (rows.length === 0) return;
		for (const row of rows) {
			const next = change(row.warnings, row.kind);
			if (next !== row.warnings) {
				await db
					.updateTable('entry_version')
					.set({ warnings: next })
					.where('id', '=', row.id)
					.execute();
			}
		}
		after = rows[rows.length - 1]!.id;
	}
}

export async function up(db: Kysely<any>): Promise<void> {
	await rewrite(db, convert);
}

/** Back to sentences, as the checks before 0006 wrote them. */
export async function down(db: Kysely<any>): Promise<void> {
	await rewrite(db, (stored) => {
		const list = JSON.parse(stored) as (Warning | string)[];
		const texts = list.map((w) =>
			typeof w === 'string'
				? w
				: w.kind === 'range' && w.source
					? `${w.message} (range source: ${w.source})`
					: w.message
		);
		return texts.length ? JSON.stringify(texts) : null;
	});
}
