import type { Kysely } from 'kysely';
import type { PotentialDto } from '$lib/catalogue/dto';
import type { PotentialSort } from '$lib/catalogue/searchTable';
import type { PotentialFilter } from '$lib/schemas/catalogueQuery';
import type { Database } from '../db/schema';
import type { ReadSnapshot } from '../db/snapshot';
import { PotentialIndex, potentialIndex } from '../search/potentialIndex';
import { ExportBusyError, ExportTooLargeError } from './errors';
import { potentialSearch, readPotentialRows } from './potentials';
import { potentialRowVisibility, type Viewer } from './visibility';

/*
 * Every potential a search matches, for the search page's "export all" (streamed CSV from
 * GET /api/v1/potentials/export). The count is known before the first row is sent, and the rows
 * sent are exactly that many: the matching ids and the rows are read from one read snapshot of
 * the database (db/snapshot.ts), so an approval or a visibility change during a long download
 * changes neither. The ids come from the search index when it was built at the snapshot's
 * revision, else from columns built from the snapshot itself (about a second at 100 000 rows).
 * Visibility is applied twice, as for any list; a row visible when the ids were taken stays
 * visible (an embargo only ends), so none drops out between count and rows.
 *
 * Bounded: at most `maxRows` rows (a larger match is refused before anything is read), at most
 * `concurrency` exports at once per process, each cut off after `timeLimitMs`; rows are read
 * 1 000 at a time as the client takes them, so memory holds one chunk, not the file.
 */

export interface ExportLimits {
	maxRows: number;
	concurrency: number;
	timeLimitMs: number;
	/** Rows read from the snapshot at a time (default 1 000). */
	chunkRows?: number;
}

export interface PotentialExport {
	total: number;
	/** Chunks of rows in the search's order; ends the snapshot when done or abandoned. */
	chunks: AsyncGenerator<PotentialDto[], void, undefined>;
	/** Stops early (the client went away); safe to call more than once. */
	cancel(): Promise<void>;
	/** Aborted when the time limit cuts the export off (even while the client reads nothing). */
	cutOff: AbortSignal;
}

let running = 0;

/** How many exports this process is streaming now (for tests and the limit). */
export function exportsRunning(): number {
	return running;
}

export async function exportPotentials(
	db: Kysely<Database>,
	openSnapshot: () => Promise<ReadSnapshot>,
	filter: PotentialFilter,
	sorting: { sort?: PotentialSort; order?: 'asc' | 'desc' },
	viewer: Viewer | null,
	limits: ExportLimits
): Promise<PotentialExport> {
	if (running >= limits.concurrency) throw new ExportBusyError(10);
	running++;
	let snapshot: ReadSnapshot | null = null;
	let released = false;
	const cutOff = new AbortController();
	const timer = setTimeout(() => {
		cutOff.abort(new Error(`export cut off after ${limits.timeLimitMs} ms`));
		void release();
	}, limits.timeLimitMs);
	timer.unref();
	const release = async () => {
		if (released) return;
		released = true;
		clearTimeout(timer);
		running--;
		await snapshot?.close();
	};
	try {
		snapshot = await openSnapshot();
		const search = await potentialSearch(db, filter, sorting.sort, sorting.order ?? 'asc', viewer);
		await potentialIndex.ensureCurrent(db);
		let index = potentialIndex;
		if (index.builtRevision !== snapshot.revision) {
			index = new PotentialIndex();
			await index.ensureCurrent(snapshot.db);
		}
		const found = index.query(
			{ ...search.query, offset: 0, limit: limits.maxRows + 1 },
			potentialRowVisibility(viewer)
		);
		const total = found.total;
		const ids = found.page;
		if (total > limits.maxRows) throw new ExportTooLargeError(total, limits.maxRows);
		const source = snapshot.db;
		const chunkRows = limits.chunkRows ?? 1000;
		async function* chunks(): AsyncGenerator<PotentialDto[], void, undefined> {
			try {
				for (let i = 0; i < ids.length; i += chunkRows) {
					cutOff.signal.throwIfAborted();
					yield await readPotentialRows(source, ids.slice(i, i + chunkRows), viewer);
				}
			} finally {
				await release();
			}
		}
		return { total, chunks: chunks(), cancel: release, cutOff: cutOff.signal };
	} catch (e) {
		await release();
		throw e;
	}
}
